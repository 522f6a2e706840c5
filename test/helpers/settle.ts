import { readdirSync, utimesSync } from "node:fs";
import { join } from "node:path";

/**
 * Date every file of `dir` (not the folder itself) a minute back, as records written long ago are:
 * the logbook caches trust a file's stamp only once it has settled (src/logbook/family-index.ts `settledStamp`).
 */
export function settle(dir: string): void {
  const then = new Date(Date.now() - 60_000);
  for (const f of readdirSync(dir)) utimesSync(join(dir, f), then, then);
}
