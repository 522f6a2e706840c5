/**
 * The workbench's speed (issue 13), printed by `npm run bench`:
 *  1. a change in the job form → its new plan over HTTP (POST /api/preview), in-process and warm,
 *     for every demo job (aim: within 100 ms);
 *  2. the first page from a cold `armwind serve` process: from starting the process to the job list's
 *     HTML, script and style sheet received (aim: under 1 s).
 */
import { spawn } from "node:child_process";
import { readdirSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { createInterface } from "node:readline";
import { serve } from "../src/web/server.js";

const cpus = availableParallelism();
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function preview(url: string, file: string, hot: number): Promise<number> {
  const t0 = performance.now();
  const r = await fetch(`${url}api/preview/${file}`, {
    method: "POST",
    body: JSON.stringify({ edits: [{ path: "target.hot_temperature", text: `${hot} C` }] }),
  });
  await r.text();
  if (r.status !== 200) throw new Error(`preview of ${file}: ${r.status}`);
  return performance.now() - t0;
}

async function benchPreview(): Promise<void> {
  const s = await serve({ dir: ".", port: 0, host: "127.0.0.1" });
  const rows: string[] = [];
  let worst = 0;
  for (const f of readdirSync("jobs").filter((n) => n.endsWith(".yaml"))) {
    const file = `jobs/${f}`;
    for (let i = 0; i < 3; i++) await preview(s.url, file, 80 + i);
    const times: number[] = [];
    for (let i = 0; i < 9; i++) times.push(await preview(s.url, file, 75 + i));
    const t = median(times);
    worst = Math.max(worst, t);
    rows.push(`${f.replace(/\.yaml$/, "")} ${t.toFixed(0)} ms`);
  }
  await s.close();
  console.log(`workbench: a job-form change to its new plan (POST /api/preview, in-process, warm; median of 9 per demo job)`);
  console.log(`  ${rows.join(", ")}; slowest ${worst.toFixed(0)} ms (aim: within 100 ms; load average ${loadavg()[0].toFixed(1)} on ${cpus} cores)`);
}

/** Start `armwind serve` and fetch the first page with its script and style sheet; ms from spawn to all received. */
async function coldFirstPage(): Promise<number> {
  const t0 = performance.now();
  const child = spawn(process.execPath, ["dist/cli/main.js", "serve", "--port", "0", "--dir", "."], { stdio: ["ignore", "pipe", "ignore"] });
  try {
    const url = await new Promise<string>((done, fail) => {
      createInterface({ input: child.stdout! }).once("line", (l) => done(l.replace(/^listening on /, "")));
      child.once("exit", (c) => fail(new Error(`serve exited ${c}`)));
    });
    const page = await fetch(url);
    await page.text();
    await Promise.all(["static/app.js", "static/style.css"].map(async (a) => (await fetch(url + a)).arrayBuffer()));
    return performance.now() - t0;
  } finally {
    child.kill("SIGTERM");
  }
}

async function benchCold(): Promise<void> {
  await coldFirstPage();
  const times: number[] = [];
  for (let i = 0; i < 5; i++) times.push(await coldFirstPage());
  console.log(`workbench: first page from a cold 'armwind serve' process (start → job list, script and styles received)`);
  console.log(`  median of 5 ${median(times).toFixed(0)} ms (aim: under 1 s; load average ${loadavg()[0].toFixed(1)} on ${cpus} cores)`);
}

await benchPreview();
await benchCold();
