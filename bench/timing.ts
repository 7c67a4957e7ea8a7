/** Repeat-and-take-the-median timers shared by the benchmarks. */

/** Median of repeated samples of `sample(f)`, ms. */
function medianMs(f: () => void, repeats: number, sample: (f: () => void) => number): number {
  const t: number[] = [];
  for (let i = 0; i < repeats; i++) t.push(sample(f));
  t.sort((a, b) => a - b);
  return t[Math.floor(t.length / 2)]!;
}

/** Median wall time of repeated calls, ms. */
export function timeMs(f: () => void, repeats: number): number {
  return medianMs(f, repeats, (g) => {
    const t0 = performance.now();
    g();
    return performance.now() - t0;
  });
}

/** Median CPU time (user + system of this process) of repeated calls, ms: steadier than wall time on a shared machine. */
export function cpuMs(f: () => void, repeats: number): number {
  return medianMs(f, repeats, (g) => {
    const c0 = process.cpuUsage();
    g();
    const c = process.cpuUsage(c0);
    return (c.user + c.system) / 1000;
  });
}
