import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix } from "../../src/response/responseMatrix.js";
import { RandomStream } from "../../src/random/stream.js";

/**
 * A small response matrix built in code: 3 angles × 2 azimuths × 4 wavelengths × 4 channels, with
 * awkward doubles (long mantissas, tiny values, exact zeros) so round trips are tested bit for bit.
 */
export function smallMatrix(): ResponseMatrix {
  const thetaDeg = [0, 30, 60];
  const phiDeg = [0, 45];
  const wavelengthNm = [400, 600, 800, 1000];
  const channels = ["R_first", "R_escape", "A_film:front:0:SiNx", "A_absorber", "T_first", "T_escape"];
  const nPoints = thetaDeg.length * phiDeg.length * wavelengthNm.length;
  const rng = new RandomStream("fixture/small-matrix");
  const mean = new Float64Array(nPoints * channels.length);
  const stderr = new Float64Array(nPoints * channels.length);
  const nRays = new Float64Array(nPoints);
  const pathRatio = new Float64Array(nPoints);
  for (let p = 0; p < nPoints; p++) {
    // Random fractions that sum to 1 per point.
    let s = 0;
    const raw = channels.map(() => rng.next());
    for (const v of raw) s += v;
    for (let c = 0; c < channels.length; c++) {
      mean[p * channels.length + c] = raw[c] / s;
      stderr[p * channels.length + c] = Math.sqrt((raw[c] / s) * (1 - raw[c] / s) / 2000);
    }
    nRays[p] = 2000 + p;
    pathRatio[p] = 1 + 3 * rng.next();
  }
  // Point 1 keeps its channels summing to 1: what channels 1 and 2 give up goes to channel 0.
  const p1 = channels.length;
  mean[p1] += mean[p1 + 1] + mean[p1 + 2] - 1e-300;
  mean[p1 + 1] = 0; // exact zero
  stderr[p1 + 1] = 0;
  mean[p1 + 2] = 1e-300; // tiny normal double
  stderr[p1 + 3] = 0.1 + 0.2; // 0.30000000000000004
  return {
    format: RESPONSE_FORMAT,
    formatVersion: RESPONSE_FORMAT_VERSION,
    toolVersion: "0.0.0-test",
    studyName: "fixture, with \"quotes\"",
    studyHash: "0".repeat(64),
    seed: 7,
    combo: {},
    thetaDeg,
    phiDeg,
    phiMode: "list",
    wavelengthNm,
    channels,
    mean,
    stderr,
    nRays,
    pathRatio,
  };
}
