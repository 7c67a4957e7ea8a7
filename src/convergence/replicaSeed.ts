/**
 * Seed of one convergence run: a 32-bit FNV-1a hash (Fowler–Noll–Vo, public-domain reference
 * algorithm) of "<study seed>/<namespace>". Each step, replica and the reference get their own seed,
 * so their streams streamKey(seed', it, ip, il, batch) never coincide with one another or,
 * barring a 2^-32 coincidence, with the sweep's streams of the same study.
 */
export function replicaSeed(studySeed: number, namespace: string): number {
  const text = `${studySeed}/${namespace}`;
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}
