import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { matrixToCsv, CSV_COLUMNS } from "../../src/export/csvExport.js";
import { matrixToExportObject } from "../../src/export/jsonExport.js";
import { writeExport, defaultExportPath } from "../../src/export/writeExport.js";
import { matrixIndex, pointIndex } from "../../src/response/responseMatrix.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import type { NpySidecar } from "../../src/export/npyExport.js";
import { parseCsv } from "./csvReader.js";
import { smallMatrix } from "./matrixFixture.js";
import { readNpy } from "./npyReader.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-export-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const bits = (a: ArrayLike<number>): Uint8Array => new Uint8Array(Float64Array.from(a).buffer);

describe("matrixToCsv(m)", () => {
  it("writes one tidy row per (theta, phi, wavelength, channel) that parses back bit for bit", () => {
    const m = smallMatrix();
    const rows = parseCsv(matrixToCsv(m));
    expect(rows[0]).toEqual([...CSV_COLUMNS]);
    const body = rows.slice(1);
    expect(body.length).toBe(m.mean.length);
    const mean = new Float64Array(m.mean.length);
    const stderr = new Float64Array(m.mean.length);
    for (const [t, p, l, ch, v, se] of body) {
      const k = matrixIndex(m, m.thetaDeg.indexOf(Number(t)), m.phiDeg.indexOf(Number(p)), m.wavelengthNm.indexOf(Number(l)), m.channels.indexOf(ch));
      mean[k] = Number(v);
      stderr[k] = Number(se);
    }
    expect(bits(mean)).toEqual(bits(m.mean));
    expect(bits(stderr)).toEqual(bits(m.stderr));
  });
});

describe("matrixToExportObject(m)", () => {
  it("nests [theta][phi][wavelength][channel] and round-trips through JSON text exactly", () => {
    const m = smallMatrix();
    const back = JSON.parse(JSON.stringify(matrixToExportObject(m))) as ReturnType<typeof matrixToExportObject>;
    expect(back.dims).toEqual(["theta_deg", "phi_deg", "wavelength_nm", "channel"]);
    expect(back.axes.channel).toEqual(m.channels);
    for (let it = 0; it < m.thetaDeg.length; it++)
      for (let ip = 0; ip < m.phiDeg.length; ip++)
        for (let il = 0; il < m.wavelengthNm.length; il++) {
          expect(back.nRays[it][ip][il]).toBe(m.nRays[pointIndex(m, it, ip, il)]);
          expect(back.pathRatio[it][ip][il]).toBe(m.pathRatio[pointIndex(m, it, ip, il)]);
          for (let ic = 0; ic < m.channels.length; ic++) {
            expect(back.mean[it][ip][il][ic]).toBe(m.mean[matrixIndex(m, it, ip, il, ic)]);
            expect(back.stderr[it][ip][il][ic]).toBe(m.stderr[matrixIndex(m, it, ip, il, ic)]);
          }
        }
  });
});

describe("writeExport(m, 'npy', sidecarPath)", () => {
  const m = smallMatrix();
  const matrixPath = join(dir, "matrix.json");
  writeResponseMatrix(matrixPath, m);
  const sidecarPath = defaultExportPath(matrixPath, "npy");
  const written = writeExport(m, "npy", sidecarPath);

  it("writes four arrays and the sidecar (last), and no temporary files remain", () => {
    expect(sidecarPath).toBe(join(dir, "matrix.npy.json"));
    expect(written[written.length - 1]).toBe(sidecarPath);
    expect(readdirSync(dir).sort()).toEqual(
      ["matrix.json", "matrix.npy.json", "matrix_mean.npy", "matrix_nrays.npy", "matrix_path_ratio.npy", "matrix_stderr.npy"].sort(),
    );
  });

  it("arrays read back with the tiny reader to the same numbers bit for bit, shapes as the sidecar says", () => {
    const side = JSON.parse(readFileSync(sidecarPath, "utf8")) as NpySidecar;
    expect(side.axes.channels).toEqual(m.channels);
    expect(side.arrays.mean.shape).toEqual([3, 2, 4, 6]);
    expect(side.arrays.nRays.shape).toEqual([3, 2, 4]);
    const expected = { mean: m.mean, stderr: m.stderr, nRays: m.nRays, pathRatio: m.pathRatio };
    for (const key of ["mean", "stderr", "nRays", "pathRatio"] as const) {
      const arr = readNpy(readFileSync(join(dir, side.arrays[key].file)));
      expect(arr.major).toBe(1);
      expect(arr.dataOffset % 64).toBe(0);
      expect(arr.shape).toEqual(side.arrays[key].shape);
      expect(bits(arr.data)).toEqual(bits(expected[key]));
    }
  });

  it("rejects an npy --out that is not a .json sidecar path, writing nothing", () => {
    expect(() => writeExport(m, "npy", join(dir, "sub", "arrays"))).toThrow(/sidecar path ending in ".json"/);
    expect(readdirSync(dir)).not.toContain("sub");
  });

  // Cross-check with NumPy itself, only where python3 with numpy exists on this machine.
  const hasNumpy = spawnSync("python3", ["-c", "import numpy"], { stdio: "ignore" }).status === 0;
  it.runIf(hasNumpy)("numpy.load reads the same values (bit for bit, via float.hex)", () => {
    const side = JSON.parse(readFileSync(sidecarPath, "utf8")) as NpySidecar;
    const script = [
      "import json, sys, numpy as np",
      "a = np.load(sys.argv[1])",
      "print(json.dumps({'dtype': a.dtype.str, 'shape': list(a.shape), 'c': bool(a.flags['C_CONTIGUOUS']), 'hex': [float(x).hex() for x in a.ravel()]}))",
    ].join("\n");
    const out = JSON.parse(execFileSync("python3", ["-c", script, join(dir, side.arrays.mean.file)], { encoding: "utf8" })) as {
      dtype: string;
      shape: number[];
      c: boolean;
      hex: string[];
    };
    expect(out.dtype).toBe("<f8");
    expect(out.shape).toEqual([3, 2, 4, 6]);
    expect(out.c).toBe(true);
    const fromNumpy = out.hex.map(hexToDouble);
    expect(bits(fromNumpy)).toEqual(bits(m.mean));
  });
});

/** Parses Python's float.hex() form (e.g. "0x1.921fb54442d18p+1") exactly. */
function hexToDouble(h: string): number {
  const mt = /^(-)?0x([01])\.([0-9a-f]*)p([+-]\d+)$/.exec(h);
  if (mt === null) {
    if (h === "0x0.0p+0") return 0;
    if (h === "-0x0.0p+0") return -0;
    throw new Error(`unexpected float.hex ${h}`);
  }
  const [, sign, lead, frac, exp] = mt;
  // value = (lead + frac/16^len) * 2^exp, computed exactly with BigInt then scaled by powers of two.
  const mant = BigInt(`0x${lead}${frac || "0"}`);
  const shift = 4 * (frac || "0").length;
  let e = Number(exp) - shift;
  let v = Number(mant); // mantissa ≤ 53 bits: exact
  while (e > 0) { const s = Math.min(e, 1000); v *= 2 ** s; e -= s; }
  while (e < 0) { const s = Math.min(-e, 1000); v /= 2 ** s; e += s; }
  return sign ? -v : v;
}
