/** Field paths as docs/contracts.md writes them: dotted, indices in brackets (`wire_stock[2]`, `original.tests[0].supply`). */
export type PathPart = string | number;

export function formatPath(parts: readonly PathPart[]): string {
  let out = "";
  for (const p of parts) {
    if (typeof p === "number") out += `[${p}]`;
    else out += out === "" ? p : `.${p}`;
  }
  return out;
}

/** Inverse of formatPath. */
export function parsePath(path: string): PathPart[] {
  const parts: PathPart[] = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) {
    if (m[2] !== undefined) parts.push(Number(m[2]));
    else parts.push(m[1]);
  }
  return parts;
}

/** Levenshtein distance, for "did you mean". */
export function editDistance(a: string, b: string): number {
  const d = Array.from({ length: a.length + 1 }, (_, i) => [i, ...new Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) d[0][j] = j;
  for (let i = 1; i <= a.length; i++)
    for (let j = 1; j <= b.length; j++) d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
  return d[a.length][b.length];
}

/** The known word nearest to `word`, if it is near enough to be a likely slip. */
export function nearest(word: string, known: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const k of known) {
    const dist = editDistance(word.toLowerCase(), k.toLowerCase());
    if (dist < bestD) {
      bestD = dist;
      best = k;
    }
  }
  if (best === undefined) return undefined;
  const limit = Math.max(2, Math.ceil(Math.min(word.length, best.length) / 3));
  return bestD <= limit || best.includes(word) || word.includes(best) ? best : undefined;
}
