/**
 * The workbench in a real browser: Debian's Chromium driven by playwright-core (no browser download),
 * against `armwind serve` started as a user starts it (the built CLI) on a copy of the demo folder.
 * Few flows, each waiting for what the page shows (no sleeps).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawn, type ChildProcess } from "node:child_process";
import { cpSync, existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { createInterface } from "node:readline";
import { chromium, type Browser, type Page } from "playwright-core";
import { CLI, demoJobFiles, ROOT, runCli } from "./helpers/cli.js";
import { GOALS } from "../src/job/schema.js";

const CHROMIUM = process.env.ARMWIND_CHROMIUM ?? "/usr/bin/chromium";
const have = existsSync(CHROMIUM);

interface Started {
  child: ChildProcess;
  url: string;
  lines: string[];
}

/** `armwind serve …` as a process; resolves with its first lines once it listens. */
function startServe(args: string[], wantLines = 1): Promise<Started> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [CLI, "serve", "--port", "0", ...args], {
      stdio: ["ignore", "pipe", "pipe"],
      env: { ...process.env, ARMWIND_LOGBOOK: "" },
    });
    const lines: string[] = [];
    const rl = createInterface({ input: child.stdout! });
    rl.on("line", (l) => {
      lines.push(l);
      if (lines.length === wantLines) done({ child, url: lines[0].replace(/^listening on /, ""), lines });
    });
    child.on("exit", (code) => fail(new Error(`armwind serve exited ${code}`)));
  });
}

let shop: string;
let local: Started;
let browser: Browser;

async function page(): Promise<Page> {
  const ctx = await browser.newContext({ viewport: { width: 820, height: 1180 } });
  return ctx.newPage();
}

describe.skipIf(!have && !process.env.CI)("the workbench in Chromium", () => {
  beforeAll(async () => {
    shop = mkdtempSync(join(tmpdir(), "armwind-browser-"));
    cpSync(join(ROOT, "jobs"), join(shop, "jobs"), { recursive: true });
    local = await startServe(["--dir", shop]);
    // evil.example resolves to this machine, as a DNS-rebinding attacker's name would
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ["--host-resolver-rules=MAP evil.example 127.0.0.1"] });
  });

  afterAll(async () => {
    await browser?.close();
    local?.child.kill("SIGTERM");
    if (shop) rmSync(shop, { recursive: true, force: true });
  });

  it("prints its address first, on the loopback", () => {
    expect(local.lines[0]).toMatch(/^listening on http:\/\/127\.0\.0\.1:\d+\/$/);
  });

  it("answers what the built command prints, run in the served folder, for every demo job", async () => {
    for (const f of demoJobFiles()) {
      const job = `jobs/${basename(f)}`;
      const cli = runCli(["plan", job, "--json"], { cwd: shop, env: { ARMWIND_LOGBOOK: join(shop, "jobs/logbook") } });
      const web = await fetch(`${local.url}api/plan/${job}`);
      expect(web.status, job).toBe(200);
      expect(await web.text(), job).toBe(cli.stdout);
    }
  });

  it("lists the jobs; opening a demo and changing the goal changes the plan", async () => {
    const p = await page();
    await p.goto(local.url);
    await p.click("a.job:text('blind-motor-0031')");
    await p.waitForSelector("#chosen");
    const before = await p.textContent("#chosen");
    expect(before).toMatch(/^\d+ turns of /);
    await p.fill('[data-field="target.no_load_speed"]', "6000 rpm");
    await p.waitForFunction((b) => document.querySelector("#chosen")?.textContent !== b, before);
    const after = await p.textContent("#chosen");
    expect(Number(after!.split(" ")[0])).toBeGreaterThan(Number(before!.split(" ")[0]));
    // a unit that makes no sense is shown at its field
    await p.fill('[data-field="target.no_load_speed"]', "6000 kg");
    await p.waitForSelector('output[data-for="target.no_load_speed"] .error');
    expect(await p.textContent('output[data-for="target.no_load_speed"]')).toContain("[bad_quantity]");
    await p.context().close();
  });

  it.skipIf(!(GOALS as readonly string[]).includes("fixed"))("another candidate, chosen on the chart, is fixed into the job as goal: fixed", async () => {
    const p = await page();
    await p.goto(`${local.url}job/jobs/blind-motor-0031.yaml`);
    await p.waitForSelector("#chosen");
    const chosen = await p.textContent("#chosen");
    const other = p.locator("circle.cand.meets").first();
    const turns = await other.getAttribute("data-turns");
    const wire = await other.getAttribute("data-wire");
    const strands = Number(await other.getAttribute("data-strands"));
    await other.click();
    await p.click("#fix");
    await p.waitForFunction((c) => document.querySelector("#chosen")?.textContent !== c, chosen);
    expect(await p.textContent("#chosen")).toBe(`${turns} turns of ${wire}${strands > 1 ? ` × ${strands} in hand` : ""}`);
    await p.context().close();
  });

  it("readings with one coil short: that coil is named and marked on the diagram", async () => {
    const p = await page();
    await p.goto(`${local.url}bench/jobs/blind-motor-0031.yaml`);
    await p.waitForSelector("[data-reading]");
    await p.fill('input[name="temperature"]', "21 C");
    const readings = ["1.329", "1.327", "1.234", "1.330", "1.327"];
    for (let i = 0; i < readings.length; i++) await p.fill(`[data-reading="${i}"]`, readings[i]);
    await p.waitForSelector('.suspect-label[data-suspect="3"]');
    expect(await p.textContent(".suspects")).toContain("coil 3");
    expect(await p.locator(".suspect-label").count()).toBe(1);
    await p.context().close();
  });

  it("readings are judged as they are typed: alone against the plan first, coil 3 named once r3 and two others are in", async () => {
    const p = await page();
    await p.goto(`${local.url}bench/jobs/blind-motor-0031.yaml`);
    await p.waitForSelector("[data-reading]");
    await p.fill('input[name="temperature"]', "21 C");
    const judged = async () => Number((await p.getAttribute("body", "data-judged")) ?? 0);
    const type = async (i: number, v: string) => {
      const n = await judged();
      await p.fill(`[data-reading="${i}"]`, v);
      await p.waitForFunction((k) => Number(document.body.dataset.judged ?? 0) > k, n);
    };
    await type(0, "1.329");
    // one reading: judged alone against the plan, no median yet
    expect(await p.textContent('.reading[data-index="0"] .judge')).toMatch(/of plan$/);
    expect(await p.textContent("#verdict-line")).toBe("1 of 5 readings: none out so far");
    await type(1, "1.327");
    await type(3, "1.330");
    expect(await p.locator(".suspect-label").count()).toBe(0);
    await type(2, "1.234");
    await p.waitForSelector('.suspect-label[data-suspect="3"]');
    expect(await p.textContent("#verdict-line")).toBe("4 of 5 readings: none out so far");
    expect(await p.textContent(".suspects")).toContain("coil 3");
    expect(await p.textContent('.reading[data-index="2"] .judge')).toMatch(/of median/);
    // the last one: the full diagnosis
    await type(4, "1.327");
    expect(await p.textContent("#verdict-line")).toMatch(/^every reading within the bench rules/);
    expect(await p.locator(".suspect-label").count()).toBe(1);
    await p.context().close();
  });

  it("readings typed at the bench are logged as log does; the same readings again only when asked", async () => {
    const p = await page();
    await p.goto(`${local.url}bench/jobs/blind-motor-0031.yaml`);
    await p.waitForSelector("[data-reading]");
    await p.fill('input[name="temperature"]', "21 C");
    await p.fill('input[name="meter_resolution"]', "0.001 ohm");
    for (const [i, v] of ["1.362", "1.355", "1.366", "1.353", "1.360"].entries()) await p.fill(`[data-reading="${i}"]`, v);
    await p.fill('input[name="terminal_resistance"]', "2.05 ohm");
    await p.click("#log");
    await p.waitForSelector("#log-status.ok");
    const first = /logged as (\S+?):/.exec((await p.textContent("#log-status"))!)![1];
    expect(existsSync(join(shop, first))).toBe(true);
    await p.click("#log");
    await p.waitForSelector("#log-again");
    expect(await p.textContent("#log-status")).toContain("already holds these readings");
    await p.click("#log-again");
    await p.waitForSelector("#log-status.ok");
    const second = /logged as (\S+?):/.exec((await p.textContent("#log-status"))!)![1];
    expect(second).not.toBe(first);
    expect(existsSync(join(shop, second))).toBe(true);
    await p.context().close();
  });

  it("the card is shown in the page, with print, paper and download", async () => {
    const p = await page();
    await p.goto(local.url);
    await p.click("tr:has(a.job:text('robot-3slot-0007')) a:text('card')");
    await p.waitForSelector("iframe#card");
    const src = await p.getAttribute("iframe#card", "src");
    expect(src).toBe("/api/card/jobs/robot-3slot-0007.yaml");
    const pdf = await p.request.get(new URL(src!, local.url).href);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()["content-type"]).toBe("application/pdf");
    expect(await p.isVisible("#print")).toBe(true);
    await p.selectOption("#paper", "letter");
    expect(await p.getAttribute("iframe#card", "src")).toBe("/api/card/jobs/robot-3slot-0007.yaml?paper=letter");
    expect(await p.getAttribute("#download", "href")).toBe("/api/card/jobs/robot-3slot-0007.yaml?paper=letter&download=1");
    await p.context().close();
  });

  it("saves a job and reloads it with its comments intact", async () => {
    const p = await page();
    await p.goto(`${local.url}job/jobs/robot-3slot-0007.yaml`);
    await p.waitForSelector("#chosen");
    const before = readFileSync(join(shop, "jobs/robot-3slot-0007.yaml"), "utf8");
    await p.fill('[data-field="customer"]', "Bench test customer (invented)");
    await p.click("#save");
    await p.waitForSelector("#save-status.ok");
    await p.reload();
    expect(await p.inputValue('[data-field="customer"]')).toBe("Bench test customer (invented)");
    const after = readFileSync(join(shop, "jobs/robot-3slot-0007.yaml"), "utf8");
    const comments = (t: string) => t.split("\n").filter((l) => l.includes("#"));
    expect(comments(after)).toEqual(comments(before));
    await p.context().close();
  });

  it("lists and unions have their own controls: a row added and one removed, a tolerance as { below, above }; saved with comments and order kept", async () => {
    const file = join(shop, "jobs/chair-wave-0045.yaml");
    const before = readFileSync(file, "utf8");
    const p = await page();
    await p.goto(`${local.url}job/jobs/chair-wave-0045.yaml`);
    await p.waitForSelector("#chosen");
    // the goal is duty: the other goals' fields are out of the way
    expect(await p.isVisible('[data-field="target.kv"]')).toBe(false);
    expect(await p.isVisible('[data-field="target.duty.torque"]')).toBe(true);
    // the second test removed, a third added and filled in, field by field
    await p.click('[data-item="original.tests[1]"] [data-remove]');
    await p.click('[data-add="original.tests"]');
    await p.fill('[data-field="original.tests[1].supply"]', "18 V");
    await p.fill('[data-field="original.tests[1].no_load_current"]', "0.95 A");
    await p.fill('[data-field="original.tests[1].no_load_speed"]', "2450 rpm");
    // a unit that makes no sense is shown at the row's field
    await p.fill('[data-field="original.tests[1].temperature"]', "20 kg");
    await p.waitForSelector('output[data-for="original.tests[1].temperature"] .error');
    await p.fill('[data-field="original.tests[1].temperature"]', "20 C");
    await p.waitForFunction(() => !document.querySelector('output[data-for="original.tests[1].temperature"] .error'));
    // the tolerance as a one-sided band: the bare value carries over into below and above
    await p.check('[data-variant-of="target.tolerance"][value="1"]');
    expect(await p.inputValue('[data-field="target.tolerance.below"]')).toBe("0.03");
    await p.fill('[data-field="target.tolerance.above"]', "0.05");
    await p.click("#save");
    await p.waitForSelector("#save-status.ok");
    const after = readFileSync(file, "utf8");
    expect(after).toContain(
      "    - { supply: 24 V, no_load_current: 1.1 A, no_load_speed: 3350 rpm, temperature: 20 C }\n    - { supply: 18 V, no_load_current: 0.95 A, no_load_speed: 2450 rpm, temperature: 20 C }\n",
    );
    expect(after).not.toContain("supply: 12 V");
    expect(after).toContain("  tolerance: { below: 0.03, above: 0.05 }\n");
    const comments = (t: string) => t.split("\n").filter((l) => l.includes("#"));
    expect(comments(after)).toEqual(comments(before));
    // the lines not edited are where they were
    const untouched = (t: string) => t.split("\n").filter((l) => !/tests:|- \{ supply|tolerance:/.test(l));
    expect(untouched(after)).toEqual(untouched(before));
    // reloaded, the form shows what was saved
    await p.reload();
    expect(await p.inputValue('[data-field="original.tests[1].supply"]')).toBe("18 V");
    expect(await p.isChecked('[data-variant-of="target.tolerance"][value="1"]')).toBe(true);
    await p.context().close();
  });

  it("a bench test shows its kind's fields: a no-load test no load-test field; switched to load, the load form, saved with kind: load", async () => {
    const file = join(shop, "jobs/drill-lap-0112.yaml");
    const p = await page();
    await p.goto(`${local.url}job/jobs/drill-lap-0112.yaml`);
    await p.waitForSelector("#chosen");
    const at = (k: string) => `[data-item="original.tests[1]"] .variant:not([hidden]) [data-field="original.tests[1].${k}"]`;
    expect(await p.isVisible(at("no_load_current"))).toBe(true);
    for (const k of ["current", "speed", "torque", "output_power"]) expect(await p.$(at(k))).toBeNull();
    await p.check('[data-variant-of="original.tests[1]"][value="1"]');
    expect(await p.$(at("no_load_current"))).toBeNull();
    // the fields both forms share keep their values
    expect(await p.inputValue(at("supply"))).toBe("120 V");
    await p.fill(at("current"), "2.4 A");
    await p.fill(at("speed"), "14000 rpm");
    await p.fill(at("torque"), "0.05 N m");
    await p.click("#save");
    await p.waitForSelector("#save-status.ok");
    expect(readFileSync(file, "utf8")).toContain(
      "    - { kind: load, supply: 120 V, temperature: 22 C, current: 2.4 A, speed: 14000 rpm, torque: 0.05 N m }\n",
    );
    await p.context().close();
  });

  it("a shunt field's current is asked for only when the field is shunt", async () => {
    const p = await page();
    await p.goto(`${local.url}job/jobs/chair-wave-0045.yaml`);
    await p.waitForSelector("#chosen");
    const fieldCurrent = '[data-field="original.tests[0].field_current"]';
    expect(await p.$(fieldCurrent)).not.toBeNull();
    expect(await p.isVisible(fieldCurrent)).toBe(false); // a permanent-magnet motor
    await p.selectOption('[data-field="armature.field"]', "shunt");
    expect(await p.isVisible(fieldCurrent)).toBe(true);
    await p.context().close();
  });

  it("refuses a foreign Host and a path outside the folder", async () => {
    const p = await page();
    const port = new URL(local.url).port;
    const foreign = await p.goto(`http://evil.example:${port}/`);
    expect(foreign?.status()).toBe(421);
    const outside = await p.goto(`${local.url}job/..%2F..%2Fetc%2Fpasswd`);
    expect(outside?.status()).toBe(403);
    await p.context().close();
  });

  it("serving the network: refused without the token, the printed link lets the tablet in", async () => {
    const net = await startServe(["--dir", shop, "--host", "0.0.0.0", "--allow-host", "127.0.0.1"], 2);
    try {
      const port = new URL(net.url).port;
      const link = /(http:\/\/\S+\?token=\S+)/.exec(net.lines[1])![1];
      const p = await page();
      const refused = await p.goto(`http://127.0.0.1:${port}/`);
      expect(refused?.status()).toBe(401);
      const token = new URL(link).searchParams.get("token");
      await p.goto(`http://127.0.0.1:${port}/?token=${token}`);
      // the token is now a cookie: the page's own API calls get through
      await p.waitForSelector("[data-verdict]");
      expect(p.url()).not.toContain("token=");
      await p.context().close();
    } finally {
      net.child.kill("SIGTERM");
    }
  });
});
