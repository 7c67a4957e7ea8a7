import type { TraceItem, TraceMessage } from "../workers/traceTask.js";
import { batchRays, plannedBatches, pointCoords, raysInBatches } from "./plan.js";
import type { PointState } from "./pointState.js";
import type { SweepRun } from "./sweepRun.js";

/** Batches b0 … b1−1 of point p, queued to be traced. */
export interface QueuedRun {
  p: number;
  b0: number;
  b1: number;
}

/**
 * Schedule stage: the FIFO of batch runs still to send (queue[head …]; a head index, not shift(),
 * keeps it O(1)) and the cutting of it into task messages. A point is merged when its planned
 * batches are all in; in target-error mode its merged tally may plan more.
 */
export class Scheduler {
  private queue: QueuedRun[] = [];
  private head = 0;
  /** Queued rays per wavelength block (combo · nλ + il): the unit a thread compiles a stack for. */
  private readonly blockRays = new Map<number, number>();
  private readonly nPerCombo: number;

  constructor(private readonly run: SweepRun) {
    const g = run.plan.grid;
    this.nPerCombo = g.thetaDeg.length * g.phiDeg.length * g.wavelengthNm.length;
  }

  queued(): number {
    return this.queue.length - this.head;
  }

  private blockOf(p: number): number {
    const nL = this.run.plan.grid.wavelengthNm.length;
    return Math.floor(p / this.nPerCombo) * nL + (p % nL);
  }

  /** Queues what is missing among a point's planned batches; merges it or plans more when all are in. */
  advance(p: number, st: PointState): void {
    const { plan } = this.run;
    const combo = pointCoords(plan.grid, p).combo;
    for (;;) {
      if (st.planned > st.requested) this.run.raysPlanned += raysInBatches(plan.rays, st.requested, st.planned);
      let b = Math.max(st.requested, st.k);
      while (b < st.planned) {
        if (st.pending.has(b)) { b++; continue; }
        const b0 = b;
        while (b < st.planned && !st.pending.has(b)) b++;
        this.queue.push({ p, b0, b1: b });
        const blk = this.blockOf(p);
        this.blockRays.set(blk, (this.blockRays.get(blk) ?? 0) + raysInBatches(plan.rays, b0, b));
      }
      st.requested = Math.max(st.requested, st.planned);
      if (st.k < st.planned) return;
      const next = plannedBatches(plan.rays, st.acc, plan.combos[combo].channels.length, this.run.targetIdx[combo], st.planned);
      if (next === st.planned) {
        st.merged = st.acc;
        this.run.pointsDone++;
        return;
      }
      st.planned = next;
    }
  }

  /** Reorders the queue with a seeded shuffle (tests: the order of tasks must not matter). */
  shuffle(seed: number): void {
    shuffle(this.queue, seed);
  }

  /**
   * Next message from the queue: whole batches, about raysPerMessage rays. A wavelength block is kept
   * in one message when it has up to twice that many rays, so most stacks are compiled by one thread.
   */
  takeMessage(raysPerMessage: number): { msg: TraceMessage; runs: QueuedRun[] } {
    const rays = this.run.plan.rays;
    const items: TraceItem[] = [];
    const runs: QueuedRun[] = [];
    let limit = raysPerMessage;
    let used = 0;
    let current = -1;
    while (this.queued() > 0) {
      const run = this.queue[this.head];
      const blk = this.blockOf(run.p);
      if (blk !== current) {
        const rest = this.blockRays.get(blk) ?? 0;
        if (items.length === 0) limit = rest <= 2 * raysPerMessage ? Math.max(rest, 1) : raysPerMessage;
        else if (used + rest > limit) break;
        current = blk;
      }
      let b1 = run.b0;
      let n = 0;
      // A message always carries at least one batch.
      while (b1 < run.b1) {
        const r = batchRays(rays, b1);
        if (used + n + r > limit && !(items.length === 0 && n === 0)) break;
        n += r;
        b1++;
      }
      if (b1 === run.b0) break;
      const piece = { p: run.p, b0: run.b0, b1 };
      if (b1 === run.b1) this.popHead();
      else run.b0 = b1;
      this.blockRays.set(blk, (this.blockRays.get(blk) ?? 0) - n);
      runs.push(piece);
      items.push(this.itemOf(piece));
      used += n;
      if (used >= limit) break;
    }
    return { msg: { items }, runs };
  }

  private popHead(): void {
    this.head++;
    if (this.head > 4096 && 2 * this.head > this.queue.length) {
      this.queue = this.queue.slice(this.head);
      this.head = 0;
    }
  }

  private itemOf(r: QueuedRun): TraceItem {
    const { grid, rays } = this.run.plan;
    const c = pointCoords(grid, r.p);
    const sizes: number[] = [];
    for (let b = r.b0; b < r.b1; b++) sizes.push(batchRays(rays, b));
    return {
      combo: c.combo, it: c.it, ip: c.ip, il: c.il,
      thetaDeg: grid.thetaDeg[c.it],
      phiDeg: grid.phiMode === "averaged" ? null : grid.phiDeg[c.ip],
      wavelengthNm: grid.wavelengthNm[c.il],
      firstBatch: r.b0,
      batchRays: sizes,
    };
  }
}

/**
 * Order in which points are first queued: combination, then wavelength, then angles, so consecutive
 * messages reuse a thread's compiled stack for that wavelength.
 */
export function scheduleOrder(run: SweepRun): [number, PointState][] {
  const g = run.plan.grid;
  const key = (p: number): number => {
    const c = pointCoords(g, p);
    return ((c.combo * g.wavelengthNm.length + c.il) * g.thetaDeg.length + c.it) * g.phiDeg.length + c.ip;
  };
  return [...run.states.entries()].sort((a, b) => key(a[0]) - key(b[0]));
}

/** Fisher–Yates with a small LCG (Numerical Recipes constants): test-only reordering. */
function shuffle<T>(a: T[], seed: number): void {
  let s = seed >>> 0;
  for (let i = a.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    const j = s % (i + 1);
    [a[i], a[j]] = [a[j], a[i]];
  }
}
