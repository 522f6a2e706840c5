/**
 * Fuzz volume in pieces: a property run of N cases becomes several tests of N/parts cases each,
 * every piece with its own seed (derived from the suite's fixed seed, test/helpers/setup.ts), so
 * the pieces explore different inputs and each test stays well inside its timeout on a busy
 * 2-core machine. The volume is the same; a failure names the piece's seed.
 */
import fc from "fast-check";

export interface Chunk {
  /** 1-based piece number, for the test name. */
  part: number;
  parts: number;
  runs: number;
  seed: number;
}

export function chunks(total: number, parts: number): Chunk[] {
  const base = fc.readConfigureGlobal().seed ?? 0;
  return Array.from({ length: parts }, (_, i) => ({
    part: i + 1,
    parts,
    runs: Math.floor(total / parts) + (i < total % parts ? 1 : 0),
    seed: (base + i * 7919) | 0,
  }));
}
