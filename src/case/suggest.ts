/** "Did you mean" suggestions by edit distance (Levenshtein, unit costs). */

export function editDistance(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  let prev = new Array<number>(n + 1);
  let cur = new Array<number>(n + 1);
  for (let j = 0; j <= n; j++) prev[j] = j;
  for (let i = 1; i <= m; i++) {
    cur[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      cur[j] = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost);
    }
    [prev, cur] = [cur, prev];
  }
  return prev[n]!;
}

/**
 * The closest candidate to `word`, compared case-insensitively, when it is
 * close enough to be a plausible typo (distance ≤ max(2, a third of its length)).
 */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  const w = word.toLowerCase();
  let best: string | undefined;
  let bestD = Infinity;
  for (const c of candidates) {
    const d = editDistance(w, c.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  if (best === undefined) return undefined;
  const limit = Math.max(2, Math.floor(best.length / 3));
  return bestD <= limit ? best : undefined;
}

/** " (did you mean 'x'?)" or "" */
export function didYouMean(word: string, candidates: readonly string[]): string {
  const c = closest(word, candidates);
  return c === undefined ? '' : ` (did you mean '${c}'?)`;
}
