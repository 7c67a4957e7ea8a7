/** Levenshtein edit distance (unit costs for insert, delete, substitute), case-insensitive. */
export function editDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  const prev = new Array<number>(t.length + 1);
  for (let j = 0; j <= t.length; j++) prev[j] = j;
  for (let i = 1; i <= s.length; i++) {
    let diag = prev[0]!;
    prev[0] = i;
    for (let j = 1; j <= t.length; j++) {
      const tmp = prev[j]!;
      prev[j] = Math.min(prev[j]! + 1, prev[j - 1]! + 1, diag + (s[i - 1] === t[j - 1] ? 0 : 1));
      diag = tmp;
    }
  }
  return prev[t.length]!;
}

/** Closest allowed word by edit distance (at most max(2, a third of its length)), for did-you-mean. */
export function nearestWord(word: string, allowed: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const a of allowed) {
    const d = editDistance(word, a);
    if (d < bestD) {
      bestD = d;
      best = a;
    }
  }
  return best !== undefined && bestD <= Math.max(2, Math.floor(best.length / 3)) ? best : undefined;
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
