import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type PhiMode, type ResponseMatrix } from "../../src/response/responseMatrix.js";

/** A small response matrix built in code: channels R and A_absorber, A = absorber(θ, φ, λ), R = 1 − A. */
export function makeMatrix(opts: {
  thetaDeg: number[];
  phiDeg?: number[];
  phiMode?: PhiMode;
  wavelengthNm?: number[];
  absorber: (thetaDeg: number, phiDeg: number, wavelengthNm: number) => number;
  stderr?: number;
  name?: string;
}): ResponseMatrix {
  const phiDeg = opts.phiDeg ?? [0];
  const wavelengthNm = opts.wavelengthNm ?? Array.from({ length: 91 }, (_, i) => 300 + 10 * i);
  const channels = ["R_first", "A_absorber"];
  const nPts = opts.thetaDeg.length * phiDeg.length * wavelengthNm.length;
  const mean = new Float64Array(nPts * 2), stderr = new Float64Array(nPts * 2);
  let k = 0;
  for (const t of opts.thetaDeg) for (const p of phiDeg) for (const l of wavelengthNm) {
    const a = opts.absorber(t, p, l);
    mean[k * 2] = 1 - a;
    mean[k * 2 + 1] = a;
    stderr[k * 2] = stderr[k * 2 + 1] = opts.stderr ?? 0;
    k++;
  }
  return {
    format: RESPONSE_FORMAT, formatVersion: RESPONSE_FORMAT_VERSION, toolVersion: "test", studyName: opts.name ?? "fixture",
    studyHash: "0", seed: 1, combo: {}, thetaDeg: opts.thetaDeg, phiDeg, phiMode: opts.phiMode ?? (phiDeg.length === 1 ? "averaged" : "list"),
    wavelengthNm, channels, mean, stderr, nRays: new Float64Array(nPts).fill(1000), pathRatio: new Float64Array(nPts).fill(1),
  };
}

export const range = (from: number, to: number, step: number): number[] =>
  Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);
