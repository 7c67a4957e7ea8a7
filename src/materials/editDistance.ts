/** Levenshtein edit distance (insertions, deletions, substitutions), case-insensitive. */
export function editDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  let prev = Array.from({ length: t.length + 1 }, (_, j) => j);
  for (let i = 1; i <= s.length; i++) {
    const cur = [i];
    for (let j = 1; j <= t.length; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      cur.push(Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost));
    }
    prev = cur;
  }
  return prev[t.length]!;
}

/** Up to `max` candidates closest to `name` (distance ≤ max(2, len/3)), plus those containing it. */
export function suggestNames(name: string, candidates: readonly string[], max = 3): string[] {
  const limit = Math.max(2, Math.floor(name.length / 3));
  const lower = name.toLowerCase();
  return candidates
    .map((c) => ({ c, d: c.toLowerCase().includes(lower) && lower.length >= 2 ? 0.5 : editDistance(name, c) }))
    .filter((x) => x.d <= limit)
    .sort((a, b) => a.d - b.d || a.c.localeCompare(b.c))
    .slice(0, max)
    .map((x) => x.c);
}
