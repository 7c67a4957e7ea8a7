import { streamKey } from "../random/stream.js";
import { ScrambledSobol, type LaunchSampling } from "../random/sobol.js";

import { REPLICA_GROUPS } from "../random/replicaGroups.js";

export type { LaunchSampling } from "../random/sobol.js";



/**
 * Launch coordinates of the rays of one batch from a scrambled Sobol' sequence: ray r of the batch
 * takes point firstIndex + r, as u = [x, y, ψ, φ] in units of the launch window, 2π and 2π.
 */
export class LaunchPoints {
  readonly u = new Float64Array(4);

  constructor(
    private readonly sequence: ScrambledSobol,
    private readonly firstIndex: number,
  ) {}

  /** Loads the launch coordinates of ray r of the batch into u. */
  load(r: number): void {
    this.sequence.point(this.firstIndex + r, this.u);
  }
}

/**
 * The launch points of batch b of grid point (it, ip, il), or null for random sampling. Batches
 * b, b + 16, b + 32 … of a point form one replica group (the sweep's pairing group b mod 16): they
 * share one scramble, drawn from the group's own key, and take consecutive stretches of its
 * sequence (batch b starts at ⌊b/16⌋·batchSize; only a point's last batch may be short), so a group
 * is one scrambled Sobol' set however its batches were scheduled, and groups are independent
 * replicas. Two stacks traced with the same seed get the same points (common random numbers).
 */
export function batchLaunchPoints(
  sampling: LaunchSampling | undefined,
  seed: number,
  lightFrom: "front" | "rear" | undefined,
  it: number,
  ip: number,
  il: number,
  batch: number,
  batchSize: number,
): LaunchPoints | null {
  if (sampling !== "sobol") return null;
  const group = batch % REPLICA_GROUPS;
  const side = lightFrom === "rear" ? ["rear"] : [];
  const key = streamKey(seed, ...side, it, ip, il, "sobol", group);
  return new LaunchPoints(new ScrambledSobol(key), Math.floor(batch / REPLICA_GROUPS) * batchSize);
}
