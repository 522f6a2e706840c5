/** Timing whole processes for the bench: alternating runs of several commands, medians. */
import { spawnSync } from "node:child_process";

export const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Wall time (ms) of one `node …args` process; throws when it fails (exit status above `okBelow`). */
export function timeOnce(args: string[], env: Record<string, string> = {}, okBelow = 1): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { encoding: "utf8", env: { ...process.env, NO_COLOR: "1", ...env }, maxBuffer: 1 << 30 });
  const t = performance.now() - t0;
  if (r.status === null || r.status >= okBelow) throw new Error(`node ${args.join(" ")} exited ${r.status}: ${r.stderr}`);
  return t;
}

/** Median wall times of each named command, its runs taken in turn with the others' (so load drifts hit all alike). */
export function alternate(cmds: Record<string, { args: string[]; env?: Record<string, string>; okBelow?: number }>, runs: number): Record<string, number> {
  const times: Record<string, number[]> = Object.fromEntries(Object.keys(cmds).map((k) => [k, []]));
  for (const [, c] of Object.entries(cmds)) timeOnce(c.args, c.env, c.okBelow); // warm the file cache
  for (let i = 0; i < runs; i++) for (const [k, c] of Object.entries(cmds)) times[k].push(timeOnce(c.args, c.env, c.okBelow));
  return Object.fromEntries(Object.entries(times).map(([k, v]) => [k, median(v)]));
}

/** One aim's line: the figure, the aim, and whether it is met. */
export function aim(what: string, figure: string, met: boolean, target: string): string {
  return `  ${met ? "met    " : "NOT met"}  ${what}: ${figure} (aim: ${target})`;
}
