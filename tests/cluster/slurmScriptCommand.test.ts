import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { Command } from "commander";
import { afterAll, describe, expect, it } from "vitest";
import { register } from "../../src/cli/commands/cluster.js";
import { InputError } from "../../src/util/errors.js";

const STUDY = resolve(import.meta.dirname, "..", "fixtures", "cluster", "tiny.study.json");
const work = mkdtempSync(join(tmpdir(), "lf-slurm-cmd-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function runCommand(args: string[]): Promise<string> {
  const program = new Command("lightfold").exitOverride();
  register(program);
  let out = "";
  const write = process.stdout.write.bind(process.stdout);
  process.stdout.write = ((chunk: string) => {
    out += chunk;
    return true;
  }) as typeof process.stdout.write;
  try {
    await program.parseAsync(["node", "lightfold", ...args]);
  } finally {
    process.stdout.write = write;
  }
  return out;
}

describe("lightfold slurm-script", () => {
  it("writes executable array, merge and submit scripts and the log folder under <out-dir>/slurm", async () => {
    const outDir = join(work, "run");
    const printed = JSON.parse(
      await runCommand(["slurm-script", STUDY, "--shards", "3", "--time", "01:00:00", "--mem", "2G", "--out-dir", outDir, "--account", "proj42", "--json"]),
    ) as Record<string, string | number>;
    expect(printed.shards).toBe(3);
    expect(printed.mergedDir).toBe(join(outDir, "merged"));
    for (const key of ["arrayScript", "mergeScript", "submitScript"]) {
      const path = String(printed[key]);
      expect(path.startsWith(join(outDir, "slurm"))).toBe(true);
      expect(statSync(path).mode & 0o111).not.toBe(0);
    }
    expect(statSync(join(outDir, "slurm", "logs")).isDirectory()).toBe(true);
    const array = readFileSync(String(printed.arrayScript), "utf8");
    expect(array).toContain("#SBATCH --array=1-3\n");
    expect(array).toContain("#SBATCH --account=proj42\n");
    expect(array).toContain("#SBATCH --job-name=lf-cluster-test-tiny\n");
    // Default launcher: this Node binary and this install's bin/lightfold.js, by absolute path.
    expect(array).toContain(`${process.execPath} ${resolve(import.meta.dirname, "..", "..", "bin", "lightfold.js")} sweep ${STUDY}`);
  });

  it("refuses bad requests with InputError naming the option, writing nothing", async () => {
    const cases: [string[], RegExp][] = [
      [["--shards", "0"], /--shards: expected a whole number from 1/],
      [["--shards", "2", "--time", "2h"], /--time: expected a Slurm time limit/],
      [["--shards", "2", "--mem", "4GB"], /--mem: expected a memory size/],
      [["--shards", "2", "--partition", "a b"], /--partition: expected one word/],
      [["--shards", "2", "--extra-sbatch", "--output=x"], /--extra-sbatch: "--output=x" is set by the generated scripts/],
    ];
    for (const [extra, message] of cases) {
      const outDir = join(work, "bad");
      const base = ["slurm-script", STUDY, "--time", "10", "--mem", "1G", "--out-dir", outDir];
      await expect(runCommand([...base, ...extra])).rejects.toThrow(message);
      await expect(runCommand([...base, ...extra])).rejects.toBeInstanceOf(InputError);
      expect(existsSync(outDir)).toBe(false);
    }
    await expect(runCommand(["slurm-script", join(work, "none.study.json"), "--shards", "2", "--time", "10", "--mem", "1G", "--out-dir", join(work, "x")]))
      .rejects.toThrow(/cannot read study file/);
    await expect(runCommand(["slurm-script", STUDY, "--shards", "2", "--time", "10", "--mem", "1G", "--out-dir", join(work, "my run")]))
      .rejects.toThrow(/--out-dir: .* holds spaces/);
  });
});
