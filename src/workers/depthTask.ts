/**
 * A generation-profile task (docs/contracts.md, Worker messages): consecutive batches
 * firstBatch, firstBatch+1, … of one wavelength of a combination at one direction, traced with
 * depth tallies and random launch points. Batch b has its own stream,
 * generationStreamKey(seed, combo, θ, φ, il, b), so how batches are grouped into messages never
 * matters.
 */
export interface DepthTraceItem {
  combo: number;
  /** Index of the wavelength in the study's grid (stream key). */
  il: number;
  wavelengthNm: number;
  thetaDeg: number;
  /** null = random azimuth per ray ("averaged"). */
  phiDeg: number | null;
  seed: number;
  firstBatch: number;
  /** Rays of each batch, in batch order. */
  batchRays: number[];
}

/** A generation-profile message: items traced in order, all on one depth grid. */
export interface DepthTraceMessage {
  kind: "depth";
  /** Depth bin edges in µm from the top of the front texture (compile option depthEdgesUm). */
  depthEdgesUm: number[];
  items: DepthTraceItem[];
}

/**
 * Length of one batch tally of a depth message: the tracer's tally of the stack (channels, totals,
 * light-trapping block) and [Σg, Σg²] per depth bin (src/trace/tally.ts, tallyLengthOf).
 */
export function depthTallyLength(baseLength: number, depthEdgesUm: readonly number[]): number {
  return baseLength + 2 * (depthEdgesUm.length - 1);
}

/** Whether a worker message is a generation-profile one (a sweep's has no kind). */
export function isDepthMessage(msg: object): msg is DepthTraceMessage {
  return (msg as { kind?: unknown }).kind === "depth";
}
