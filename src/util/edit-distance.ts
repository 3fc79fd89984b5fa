/**
 * Optimal string alignment distance (Damerau–Levenshtein with adjacent transpositions; common practice).
 * @example editDistance("TOLS", "TOOLS") // → 1
 */
export function editDistance(a: string, b: string): number {
  const d = Array.from({ length: a.length + 1 }, (_, i) => [i, ...new Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) d[0][j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
    }
  }
  return d[a.length][b.length];
}

/**
 * The same distance when it is at most `max`, else any number above `max` (one row past the bound stops
 * the work): the inner step of a nearest-name search, which only needs to know whether a name beats the
 * best so far.
 * @example editDistanceWithin("READ_SMSS", "READ_SMS", 1) // → 1
 */
export function editDistanceWithin(a: string, b: string, max: number): number {
  if (Math.abs(a.length - b.length) > max) return max + 1;
  let prev2: number[] = [];
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    let rowMin = i;
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(prev[j] + 1, row[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, prev2[j - 2] + 1);
      row.push(v);
      if (v < rowMin) rowMin = v;
    }
    // Every later cell grows from this row's or the one before's (transpositions): both past the bound, done.
    if (rowMin > max && (i === 1 || Math.min(...prev) > max)) return max + 1;
    prev2 = prev;
    prev = row;
  }
  return prev[b.length];
}
