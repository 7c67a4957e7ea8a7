import { describe, expect, it } from "vitest";
import { createProgressReporter, progressLine } from "../../src/sweep/progressReporter.js";

describe("progress output", () => {
  it("progressLine(p) gives rays, points, rate (rays traced now ÷ elapsed) and the ETA of what is left", () => {
    // 300k of 1.2M rays done, 100k of them from a journal, after 20 s: 10k rays/s, 900k left → 90 s.
    const line = progressLine({ raysDone: 300_000, raysPlanned: 1_200_000, raysTracedNow: 200_000, pointsDone: 40, pointsTotal: 160, elapsedS: 20 });
    expect(line).toBe("rays 300.0k/1.20M (25.0%), points 40/160, 10.0k rays/s, elapsed 20s, ETA 1m30s");
  });

  it("writes a plain line at most every interval when not on a terminal, the last one at stop, nothing when quiet", () => {
    const written: string[] = [];
    const stream = { isTTY: false, write: (s: string) => written.push(s) } as unknown as NodeJS.WriteStream;
    const r = createProgressReporter("auto", stream, 10);
    const p = (elapsedS: number) => ({ raysDone: elapsedS * 100, raysPlanned: 10_000, raysTracedNow: elapsedS * 100, pointsDone: 0, pointsTotal: 4, elapsedS });
    for (const t of [0, 3, 9, 10, 15, 21, 22]) r.update(p(t));
    r.stop();
    expect(written.map((w) => /elapsed (\d+)s/.exec(w)?.[1])).toEqual(["0", "10", "21", "22"]);
    expect(written.every((w) => w.startsWith("lightfold sweep: rays "))).toBe(true);

    const quiet: string[] = [];
    const q = createProgressReporter("quiet", { isTTY: false, write: (s: string) => quiet.push(s) } as unknown as NodeJS.WriteStream);
    q.update(p(50));
    q.stop();
    expect(quiet).toEqual([]);
  });
});
