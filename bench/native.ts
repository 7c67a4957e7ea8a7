import { spawnSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { MaterialRegistry } from "../src/materials/registry.js";
import { packageRoot } from "../src/util/packageRoot.js";

/**
 * The native reference of the tracer bench case (bench/native/pyramids.c), compiled at bench time
 * with the first C compiler found. Its Si optical constants are passed in from lightfold's own table
 * (Si-Green2008 at the wavelength), so both trace the same material.
 */
export interface NativeRun {
  rays: number;
  events: number;
  /** CPU seconds of the tracing loop (C clock()). */
  seconds: number;
  channels: Record<string, [number, number]>;
  /** With lightfold's per-ray figures (`--figures`): "figures". */
  mode?: string;
  /** With `--figures`: mean ± SE of R_first, R_escape, pathRatio, entered, freePath, afterPassK, escapeDegB, ... */
  figures?: Record<string, [number, number]>;
}

export interface NativeTracer {
  compiler: string;
  /**
   * One run of the reference. figures: with the per-ray work lightfold's analog kernel does beyond
   * the bare kernel (substream per ray, R_first / R_escape, passes, escape angles, α → 0 path, sums
   * and squares), to calibrate what those figures cost; the bare kernel stays the speed goal's measure.
   */
  run(wavelengthNm: number, nRays: number, seed: number, figures?: boolean): NativeRun;
}

const COMPILERS: [string, string[]][] = [
  ["cc", []],
  ["gcc", []],
  ["clang", []],
  ["g++", ["-x", "c"]],
];

/** Compiles the reference; undefined (with the reason) when no compiler is present or it fails. */
export function buildNativeTracer(): NativeTracer | string {
  const src = join(packageRoot(), "bench", "native", "pyramids.c");
  const exe = join(mkdtempSync(join(tmpdir(), "lf-native-")), "pyramids");
  const tried: string[] = [];
  for (const [cc, lang] of COMPILERS) {
    const probe = spawnSync(cc, ["--version"], { encoding: "utf8" });
    if (probe.error !== undefined || probe.status !== 0) continue;
    const build = spawnSync(cc, [...lang, "-O2", "-std=c99", "-o", exe, src, "-lm"], { encoding: "utf8" });
    if (build.status === 0) return nativeTracer(cc, exe);
    tried.push(`${cc}: ${(build.stderr || build.error?.message || "failed").split("\n")[0]}`);
  }
  return tried.length === 0 ? "no C compiler found (cc, gcc, clang, g++)" : `the C reference did not compile (${tried.join("; ")})`;
}

function nativeTracer(compiler: string, exe: string): NativeTracer {
  const si = MaterialRegistry.withBuiltins().get("Si-Green2008");
  return {
    compiler,
    run(wavelengthNm, nRays, seed, figures = false) {
      const { n, k } = si.nk(wavelengthNm);
      const args = [String(n), String(k), String(wavelengthNm), String(nRays), String(seed)];
      const r = spawnSync(exe, figures ? ["--figures", ...args] : args, { encoding: "utf8" });
      if (r.status !== 0) throw new Error(`native reference failed: ${r.stderr || r.error?.message}`);
      return JSON.parse(r.stdout) as NativeRun;
    },
  };
}
