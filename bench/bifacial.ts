/**
 * Rear-light (bifacial) yield speed: view factors and sight tables per mounting, the face response
 * quadrature per plane and matrix, and the year's hour loop per face; one tilt × pitch sweep. Matrix
 * of typical size built in code (θ 0–85° step 5, φ averaged, λ 300–1200 nm step 10).
 */
import { readFileSync } from "node:fs";
import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix } from "../src/response/responseMatrix.js";
import { siteFromJson } from "../src/site/siteFile.js";
import { moduleFrame } from "../src/sky/moduleFrame.js";
import { checkRowGeometry } from "../src/sky/rowGeometry.js";
import { rowLight } from "../src/sky/rowIrradiance.js";
import { packageRoot } from "../src/util/packageRoot.js";
import { syntheticWeather } from "../src/weather/synthetic.js";
import { bifacialSweep } from "../src/yield/bifacialYield.js";
import { faceQuadrature } from "../src/yield/faceQuadrature.js";
import { faceYield } from "../src/yield/faceYield.js";
import { yearContext } from "../src/yield/yearContext.js";
import { planeList, prepareMatrix } from "../src/yield/yieldRun.js";
import { cpuMs } from "./timing.js";

function matrix(scale: number, lightFrom?: "rear"): ResponseMatrix {
  const thetaDeg = Array.from({ length: 18 }, (_, i) => 5 * i);
  const wavelengthNm = Array.from({ length: 91 }, (_, i) => 300 + 10 * i);
  const n = thetaDeg.length * wavelengthNm.length;
  const mean = new Float64Array(2 * n), stderr = new Float64Array(2 * n).fill(0.002);
  let k = 0;
  for (const t of thetaDeg) for (const l of wavelengthNm) {
    const a = scale * Math.cos((t * Math.PI) / 200) * (l < 1000 ? 1 : Math.max(0, 1 - (l - 1000) / 200));
    mean[2 * k] = 1 - a;
    mean[2 * k + 1] = a;
    k++;
  }
  return {
    format: RESPONSE_FORMAT, formatVersion: RESPONSE_FORMAT_VERSION, toolVersion: "bench", studyName: "bench", studyHash: "0", seed: 1, combo: {},
    thetaDeg, phiDeg: [0], phiMode: "averaged", wavelengthNm, channels: ["R", "A_absorber"], mean, stderr,
    nRays: new Float64Array(n).fill(1e4), pathRatio: new Float64Array(n).fill(1), ...(lightFrom ? { lightFrom } : {}),
  };
}

export async function runBifacialBench(): Promise<void> {
  const path = `${packageRoot()}/configs/sites/saltmere-plain.site.json`;
  const site = siteFromJson(readFileSync(path, "utf8"), path);
  const ctx = yearContext(site, syntheticWeather(site, 2027, 7));
  const front = prepareMatrix(matrix(0.9), "front"), rear = prepareMatrix(matrix(0.85, "rear"), "rear");
  const plane = { tiltDeg: 25, azimuthDeg: 180, textureRotationDeg: 0 };
  const rows = checkRowGeometry({ tiltDeg: 25, slantLengthM: 2.2, centreHeightM: 1.2, pitchM: 6 }, "bench");
  const iso = checkRowGeometry({ tiltDeg: 25, slantLengthM: 2.2, centreHeightM: 1.2 }, "bench");
  const tLightRows = cpuMs(() => rowLight(rows, 180), 5);
  const tLightIso = cpuMs(() => rowLight(iso, 180), 5);
  const light = rowLight(rows, 180), frame = moduleFrame(plane);
  const tQuad = cpuMs(() => faceQuadrature(light, frame, "rear", rear.grid), 5);
  const q = faceQuadrature(light, frame, "rear", rear.grid);
  const tYear = cpuMs(() => faceYield(ctx, light, frame, q, rear.grid, rear.tables, "perez"), 5);
  const planes = planeList([10, 20, 30, 40], [180], 0);
  const tSweep = cpuMs(() => bifacialSweep(ctx, planes, [4, 5.5, 7, 10, null], { slantLengthM: 2.2, centreHeightM: 1.2 }, front, rear, "perez"), 1);
  const rowsOut = [
    ["view factors + sight tables + ground sky views, rows (100 bands, 24 face points × 2 faces)", tLightRows],
    ["the same, isolated row (102 bands)", tLightIso],
    ["face response quadrature (12 points × 45 × 96 directions), one face", tQuad],
    ["year's hour loop, one face (8760 h × 100 bands)", tYear],
    ["4 tilts × 5 mountings, front + rear, from scratch", tSweep],
  ] as const;
  for (const [what, ms] of rowsOut) process.stdout.write(`${what.padEnd(92)} ${ms.toFixed(1).padStart(8)} ms CPU (median)\n`);
}
