import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { expect } from "vitest";
import type { ResponseMatrix } from "../../src/response/responseMatrix.js";
import { loadStudyFromDocument, type LoadedStudy } from "../../src/study/load.js";

export const STAND_IN_TRACER = join(import.meta.dirname, "..", "fixtures", "standInTracer.mjs");

export function tempDir(prefix: string): string {
  return mkdtempSync(join(tmpdir(), `lf-${prefix}-`));
}

/** A tiny textured study: 2 angles × 1 azimuth × 3 wavelengths, few rays in small batches. */
export function tinyDoc(over: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    name: "tiny",
    stack: {
      front: { texture: { type: "upright-pyramids", baseUm: 10 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    },
    grid: { thetaDeg: [0, 60], phiDeg: [0], wavelengthNm: [600, 900, 1100] },
    rays: { perPoint: 130, batch: 40 },
    seed: 11,
    ...over,
  };
}

export function tinyStudy(over: Record<string, unknown> = {}): LoadedStudy {
  return loadStudyFromDocument(tinyDoc(over), { baseDir: tmpdir() });
}

/** Bytes of every statistic of a matrix, for bit-for-bit comparisons. */
export function matrixBytes(m: ResponseMatrix): string {
  const groups = [m.groupMean, m.groupRays].filter((a): a is Float64Array => a !== undefined);
  return [m.mean, m.stderr, m.nRays, m.pathRatio, ...groups].map((a) => Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("hex")).join("|");
}

export function expectSameMatrices(a: ResponseMatrix[], b: ResponseMatrix[]): void {
  expect(a.length).toBe(b.length);
  a.forEach((m, i) => {
    expect(matrixBytes(b[i])).toBe(matrixBytes(m));
    expect(b[i].channels).toEqual(m.channels);
  });
}
