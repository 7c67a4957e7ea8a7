import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix } from "../../src/response/responseMatrix.js";

/** An empty matrix of the given grid (means and errors to be filled by the test). */
export function emptyMatrix(thetaDeg: number[], phiDeg: number[], wavelengthNm: number[], channels: string[]): ResponseMatrix {
  const nPoints = thetaDeg.length * phiDeg.length * wavelengthNm.length;
  return {
    format: RESPONSE_FORMAT,
    formatVersion: RESPONSE_FORMAT_VERSION,
    toolVersion: "0.0.0-test",
    studyName: "weighting fixture",
    studyHash: "f".repeat(64),
    seed: 1,
    combo: {},
    thetaDeg,
    phiDeg,
    phiMode: phiDeg.length === 1 ? "averaged" : "list",
    wavelengthNm,
    channels,
    mean: new Float64Array(nPoints * channels.length),
    stderr: new Float64Array(nPoints * channels.length),
    nRays: new Float64Array(nPoints).fill(1000),
    pathRatio: new Float64Array(nPoints).fill(1),
  };
}

/** Unpolarised Fresnel reflectance air → real index n (Hecht, Optics, Fresnel equations: rs, rp; R = (Rs+Rp)/2). */
export function fresnelR(n: number, thetaDeg: number): number {
  const ci = Math.cos((thetaDeg * Math.PI) / 180);
  const si = Math.sin((thetaDeg * Math.PI) / 180);
  const ct = Math.sqrt(1 - (si / n) ** 2);
  const rs = (ci - n * ct) / (ci + n * ct);
  const rp = (n * ci - ct) / (n * ci + ct);
  return (rs * rs + rp * rp) / 2;
}
