import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { vi } from "vitest";
import { main } from "../../src/cli/main.js";

/** Repository root (the built CLI runs from here). */
export const ROOT = join(import.meta.dirname, "..", "..");
/** The built command-line entry point (`npm test` builds first; alone: `npx tsc -p .` then vitest). */
export const BIN = join(ROOT, "bin", "lightfold.js");

/** Runs `lightfold <args>` in this process through main(), capturing stdout and stderr. */
export async function runMain(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const o = vi.spyOn(process.stdout, "write").mockImplementation((s: string | Uint8Array) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, "write").mockImplementation((s: string | Uint8Array) => ((err += String(s)), true));
  try {
    const code = await main(["node", "lightfold", ...args]);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

/** Runs the built CLI as a child process from the repository root, with NO_COLOR set. */
export function spawnLightfold(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: "utf8", env: { ...process.env, NO_COLOR: "1" } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
