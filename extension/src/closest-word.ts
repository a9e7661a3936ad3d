// "Did you mean …?" for a mistyped name: a command, a flag, a field of the corpus.

/** The candidate within edit distance 2 (or that the word starts), if exactly one is nearest. */
export function closest(word: string, candidates: readonly string[]): string | null {
  let best: string | null = null;
  let bestDistance = Infinity;
  let tie = false;
  for (const c of candidates) {
    const d = c.startsWith(word) && word.length >= 3 ? 0.5 : editDistance(word, c);
    if (d < bestDistance) {
      best = c;
      bestDistance = d;
      tie = false;
    } else if (d === bestDistance) tie = true;
  }
  return best !== null && bestDistance <= 2 && !tie ? best : null;
}

/** Levenshtein distance (insert, delete, substitute), one row at a time. */
function editDistance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      row[j] = Math.min(prev[j]! + 1, row[j - 1]! + 1, prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    prev = row;
  }
  return prev[b.length]!;
}

/** The name a mistyped `wanted` most likely meant: the same but for case, else the closest within edit distance 2. */
export function meantName(wanted: string, names: readonly string[]): string | null {
  return names.find((n) => n.toLowerCase() === wanted.toLowerCase()) ?? closest(wanted, names);
}
