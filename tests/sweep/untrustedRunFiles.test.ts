import { cpSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { entryLine, readJournal } from "../../src/sweep/journal.js";
import { mergeShards } from "../../src/sweep/mergeShards.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { InputError } from "../../src/util/errors.js";
import { expectSameMatrices, tempDir, tinyStudy } from "./helpers.js";

let shardRun = "";
beforeAll(async () => {
  shardRun = tempDir("crafted-base");
  for (const index of [1, 2]) await runSweep({ study: tinyStudy(), outDir: shardRun, workers: 1, shard: { index, count: 2 } });
});

/** A copy of a two-shard run of the tiny study; returns its folder. */
async function twoShards(): Promise<string> {
  const out = tempDir("crafted");
  cpSync(shardRun, out, { recursive: true });
  return out;
}

/** Edits shard 1's partial.json of a run folder. */
function editShard(out: string, edit: (doc: { plan: { combos: { label: string }[] }; tallies: number[][]; points: number[] }) => void): string {
  const path = join(out, "shards", "shard-1-of-2", "partial.json");
  const doc = JSON.parse(readFileSync(path, "utf8"));
  edit(doc);
  writeFileSync(path, JSON.stringify(doc));
  return path;
}

function mergeError(out: string, label = ""): string {
  try {
    mergeShards({ inputs: [out], outDir: join(out, "merged") });
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as Error).message;
  }
  throw new Error(`merge accepted a crafted shard ${label}`);
}

// Channels of the tiny study: R_first, R_escape, A_film:front:0:SiNx, A_absorber, A_rear, T_first,
// T_escape, unresolved (8): the tally is [sum, sumSq] × 8 (A_absorber's sum at index 6), then nRays
// at index 16, pathSum, pathSumSq, events, then the light-trapping block.
describe("merge refuses crafted shard outputs, naming the file and the reason, writing nothing", () => {
  it("a combination label that climbs out of --out (../../X)", async () => {
    const out = await twoShards();
    const path = editShard(out, (d) => (d.plan.combos[0].label = "../../X"));
    expect(mergeError(out)).toMatch(new RegExp(`^${path.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&")}: plan\\.combos\\[0\\]\\.label: expected a plain folder name`));
    expect(existsSync(join(out, "merged"))).toBe(false);
    expect(existsSync(join(dirname(out), "X"))).toBe(false);
  });

  it("a channel sum raised by 100 rays' worth, a ray count changed, a negative or non-finite entry", async () => {
    const cases: [(d: { tallies: number[][] }) => void, RegExp][] = [
      [(d) => (d.tallies[0][6] += 100), /tallies\[0\]: expected a sound tally of point 0; channels sum to 1\.7/],
      [(d) => (d.tallies[1][16] *= 4), /tallies\[1\]: expected a sound tally of point 2; 520 rays, expected the plan's 130/],
      // A_absorber's sum negated, R raised by twice as much: the total still matches the ray count.
      [(d) => { d.tallies[0][0] += 2 * d.tallies[0][6]; d.tallies[0][6] = -d.tallies[0][6]; }, /tallies\[0\]: expected a sound tally of point 0; channel \d/],
      [(d) => ((d.tallies[2] as unknown[])[3] = "1e308"), /tallies\[2\]\[3\]: expected a finite number/],
    ];
    for (const [k, [edit, why]] of cases.entries()) {
      const out = await twoShards();
      editShard(out, edit as never);
      expect(mergeError(out, `case ${k}`)).toMatch(why);
      expect(existsSync(join(out, "merged"))).toBe(false);
    }
  });

  it("points outside the plan, out of order, or a shard number beyond the split", async () => {
    const out = await twoShards();
    editShard(out, (d) => (d.points[1] = 9999));
    expect(mergeError(out)).toMatch(/points\[1\]: expected an integer in \[0, 5\], got 9999/);
    const again = await twoShards();
    editShard(again, (d) => ((d as unknown as { shard: { index: number } }).shard.index = 3));
    expect(mergeError(again)).toMatch(/shard\.index: expected an integer in \[1, 2\], got 3/);
  });
});

describe("a journal line edited and resealed with a recomputed checksum", () => {
  it("is refused on resume (named by line and reason) and its tasks traced again: the matrix is the clean run's", async () => {
    const study = tinyStudy();
    const clean = await runSweep({ study, workers: 1 });
    const out = tempDir("resealed");
    await runSweep({ study, outDir: out, workers: 1 });
    const jPath = join(out, "journal.jsonl");
    const { entries } = readJournal(jPath);
    const lines = readFileSync(jPath, "utf8").split("\n").filter((l) => l !== "");
    // Two points' final prefixes (all 4 batches): one with channel 0's sum lowered (the channels sum
    // to 0.77 of the power), one with a channel sum of −999; both resealed with a fresh checksum.
    const finals = entries.filter((e) => e.kind === "prefix" && e.nBatches === 4);
    const [a, b] = [finals[0]!, finals[1]!];
    const e2 = { ...a, tally: a.tally.slice() };
    e2.tally[0] -= 0.23 * e2.nRays;
    const e3 = { ...b, tally: b.tally.slice() };
    e3.tally[4] = -999;
    lines[a.line! - 1] = entryLine(e2).trimEnd();
    lines[b.line! - 1] = entryLine(e3).trimEnd();
    writeFileSync(jPath, lines.join("\n") + "\n");
    const notices: string[] = [];
    const again = await runSweep({ study, outDir: out, workers: 1, onNotice: (m) => notices.push(m) });
    expect(notices.join("\n")).toMatch(/2 line\(s\) refused as unsound \(line \d+: channels sum to 0\.7(7|69)\d*.*; line \d+: channels sum to -\d/);
    // At most the two points are traced again (from an earlier sound prefix of theirs, if any).
    expect(again.raysTraced).toBeGreaterThan(0);
    expect(again.raysTraced).toBeLessThanOrEqual(2 * 130);
    expectSameMatrices(clean.matrices, again.matrices);
  });

  it("a journal that is a directory is an input error, not a crash", async () => {
    const out = tempDir("journal-dir");
    mkdirSync(join(out, "journal.jsonl"));
    await expect(runSweep({ study: tinyStudy(), outDir: out, workers: 1 })).rejects.toThrow(/journal\.jsonl: the run's journal is not a regular file/);
    expect(readdirSync(out)).toEqual(["journal.jsonl"]);
    rmSync(out, { recursive: true });
  });
});
