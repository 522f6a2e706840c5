/**
 * The workbench's HTTP contract (DESIGN.md): the API answers exactly what the CLI prints with
 * --json, for every demo job; HTTP statuses follow exit statuses; every refusal the contract names
 * (foreign Host, foreign Origin, no token when serving the network, a path outside the folder, an
 * oversized body, malformed YAML) is tested here against a real server on a free port, in-process.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cpSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { basename, join } from "node:path";
import { request } from "node:http";
import { serve, type Served } from "../src/web/server.js";
import { demoJobFiles, ROOT, runMain } from "./helpers/cli.js";

interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

/** A raw HTTP request (fetch would not let a test set Host or Origin). */
function http(url: string, opts: { method?: string; headers?: Record<string, string>; body?: string | Buffer } = {}): Promise<Answer> {
  return new Promise((done, fail) => {
    const req = request(url, { method: opts.method ?? "GET", headers: opts.headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => done({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString("utf8") }));
    });
    req.on("error", fail);
    if (opts.body !== undefined) req.write(opts.body);
    req.end();
  });
}

let local: Served;
let shop: string;
let shopServed: Served;

beforeAll(async () => {
  // the servers use the folder's own jobs/logbook, never a logbook named in the environment
  delete process.env.ARMWIND_LOGBOOK;
  local = await serve({ dir: ROOT, port: 0, host: "127.0.0.1" });
  // a shop folder of our own for the tests that write
  shop = mkdtempSync(join(tmpdir(), "armwind-web-"));
  cpSync(join(ROOT, "jobs"), join(shop, "jobs"), { recursive: true });
  shopServed = await serve({ dir: shop, port: 0, host: "127.0.0.1", maxBody: 64 * 1024 });
});

afterAll(async () => {
  await local?.close();
  await shopServed?.close();
  if (shop) rmSync(shop, { recursive: true, force: true });
});

describe("the API is the CLI", () => {
  const jobs = demoJobFiles().map((f) => `jobs/${basename(f)}`);

  it.each(jobs)("GET /api/plan and /api/check of %s give exactly what the CLI prints", async (job) => {
    for (const cmd of ["plan", "check"]) {
      const cli = await runMain([cmd, job, "--json"]);
      const web = await http(`${local.url}api/${cmd}/${job}`);
      expect(web.body).toBe(cli.stdout);
      expect(web.status).toBe(cli.status === 1 ? 422 : 200);
      expect(JSON.parse(web.body).job_id).toBeTruthy();
    }
  });

  it.each(jobs)("POST /api/plan with %s as the body gives what `plan - --json` prints", async (job) => {
    const text = readFileSync(join(ROOT, job), "utf8");
    const cli = await runMain(["plan", "-", "--json"], { input: text });
    const web = await http(`${local.url}api/plan`, { method: "POST", body: text, headers: { "content-type": "application/yaml" } });
    expect(web.status).toBe(200);
    expect(web.body).toBe(cli.stdout);
  });

  it("a goal no winding meets is 200 with feasible false (exit status 2)", async () => {
    const text = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"), "utf8").replace(/no_load_speed: 9000 rpm/, "no_load_speed: 90000 rpm");
    expect(text).toContain("90000 rpm");
    const cli = await runMain(["plan", "-", "--json"], { input: text });
    expect(cli.status).toBe(2);
    const web = await http(`${local.url}api/plan`, { method: "POST", body: text });
    expect(web.status).toBe(200);
    expect(JSON.parse(web.body).feasible).toBe(false);
  });

  it("malformed YAML is 422 with the CLI's error codes", async () => {
    const web = await http(`${local.url}api/plan`, { method: "POST", body: "version: 1\narmature: [\n" });
    expect(web.status).toBe(422);
    const j = JSON.parse(web.body);
    expect(j.ok).toBe(false);
    expect(j.errors[0].code).toBe("bad_yaml");
    const wrongUnit = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"), "utf8").replace("stack_length: 12 mm", "stack_length: 12 kg");
    const check = await http(`${local.url}api/check`, { method: "POST", body: wrongUnit });
    expect(check.status).toBe(422);
    expect(JSON.parse(check.body).errors[0]).toMatchObject({ code: "bad_quantity", path: "armature.stack_length", file: "<stdin>" });
  });

  it("diagnose names coil 3 of the demo's short-coil readings, as the CLI does", async () => {
    const bars = ["1.329", "1.327", "1.234", "1.330", "1.327"];
    const web = await http(`${local.url}api/diagnose/jobs/blind-motor-0031.yaml`, { method: "POST", body: JSON.stringify({ bars, temperature: "21 C" }) });
    const cli = await runMain(["diagnose", "jobs/blind-motor-0031.yaml", `--bars=${bars.join(",")}`, "--temperature=21 C", "--json"]);
    expect(web.body).toBe(cli.stdout);
    expect(web.status).toBe(200);
    const j = JSON.parse(web.body);
    expect(j.suspects.flatMap((s: { coils: number[] }) => s.coils)).toEqual([3]);
  });

  it("readings still being typed: diagnose --partial, as the CLI does; coil 3 named once r3 and two others are in", async () => {
    const post = (bars: string[]) =>
      http(`${local.url}api/diagnose/jobs/blind-motor-0031.yaml`, { method: "POST", body: JSON.stringify({ bars, temperature: "21 C", partial: true }) });
    const bars = ["1.329", "", "1.234", "1.330", ""];
    const web = await post(bars);
    const cli = await runMain(["diagnose", "jobs/blind-motor-0031.yaml", `--bars=${bars.join(",")}`, "--temperature=21 C", "--partial", "--json"]);
    expect(web.status).toBe(200);
    expect(web.body).toBe(cli.stdout);
    const j = JSON.parse(web.body);
    expect(j).toMatchObject({ partial: true, read: 3, of: 5 });
    expect(j.suspects.flatMap((s: { coils: number[] }) => s.coils)).toEqual([3]);
    // without r3, nothing to say of coil 3
    const without = JSON.parse((await post(["1.329", "1.327", "", "1.330", ""])).body);
    expect(without.suspects).toEqual([]);
    expect(without.coils[2].verdict).toBe("unknown");
    // a blank without --partial is still a reading that is not a number
    const strict = await http(`${local.url}api/diagnose/jobs/blind-motor-0031.yaml`, { method: "POST", body: JSON.stringify({ bars }) });
    expect(strict.status).toBe(422);
  });

  it("a reading that is not a number is 422 naming its reading", async () => {
    const web = await http(`${local.url}api/diagnose/jobs/blind-motor-0031.yaml`, {
      method: "POST",
      body: JSON.stringify({ bars: ["1.3", "x", "1.3", "1.3", "1.3"] }),
    });
    expect(web.status).toBe(422);
    // the CLI names the option it came through (issue 14: option problems are not located in the job)
    expect(JSON.parse(web.body).errors[0]).toMatchObject({ code: "bad_quantity", path: "--bars[1]", file: null });
  });

  it("history and wires are the CLI's JSON", async () => {
    for (const [path, args] of [
      ["api/history", ["history", "--json"]],
      ["api/history?family=blind-5slot", ["history", "--json", "--family=blind-5slot"]],
      ["api/wires", ["wires", "--json"]],
    ] as const) {
      const web = await http(`${local.url}${path}`);
      expect(web.status).toBe(200);
      expect(web.body).toBe((await runMain([...args])).stdout);
    }
  });

  it("the card is the card command's PDF", async () => {
    const web = await http(`${local.url}api/card/jobs/robot-3slot-0007.yaml`);
    expect(web.status).toBe(200);
    expect(web.headers["content-type"]).toBe("application/pdf");
    expect(web.body.startsWith("%PDF-")).toBe(true);
    // the card page frames it: its own origin may, no other (the pages themselves are never framed)
    expect(web.headers["content-security-policy"]).toContain("frame-ancestors 'self'");
    expect(web.headers["x-frame-options"]).toBe("SAMEORIGIN");
    const page = await http(`${local.url}job/jobs/robot-3slot-0007.yaml`);
    expect(page.headers["x-frame-options"]).toBe("DENY");
    const download = await http(`${local.url}api/card/jobs/robot-3slot-0007.yaml?download=1&paper=letter`);
    expect(download.headers["content-disposition"]).toMatch(/^attachment; filename="robot-3slot-0007.pdf"/);
  });
});

describe("refusals", () => {
  it("a foreign Host header is refused (DNS rebinding)", async () => {
    for (const host of ["evil.example", "evil.example:80", "127.0.0.1.evil.example"]) {
      const r = await http(`${local.url}api/plan/jobs/blind-motor-0031.yaml`, { headers: { host } });
      expect(r.status).toBe(421);
      expect(JSON.parse(r.body).errors[0].code).toBe("host_refused");
    }
    const ok = await http(`${local.url}`, { headers: { host: `localhost:${new URL(local.url).port}` } });
    expect(ok.status).toBe(200);
  });

  it("a change from a foreign Origin is refused; the same origin is not", async () => {
    const body = readFileSync(join(ROOT, "jobs/blind-motor-0031.yaml"));
    const bad = await http(`${local.url}api/plan`, { method: "POST", body, headers: { origin: "http://evil.example" } });
    expect(bad.status).toBe(403);
    expect(JSON.parse(bad.body).errors[0].code).toBe("origin_refused");
    const site = await http(`${local.url}api/plan`, { method: "POST", body, headers: { "sec-fetch-site": "cross-site" } });
    expect(site.status).toBe(403);
    const good = await http(`${local.url}api/plan`, { method: "POST", body, headers: { origin: local.url.replace(/\/$/, "") } });
    expect(good.status).toBe(200);
  });

  it("a path that leaves the folder is refused", async () => {
    const link = join(shop, "jobs", "escape.yaml");
    symlinkSync(join(ROOT, "package.json"), link);
    for (const p of [
      "api/plan/..%2Fpackage.json",
      "api/plan/jobs%2F..%2F..%2Fetc%2Fpasswd",
      "api/plan/%2Fetc%2Fpasswd",
      "api/plan/--help",
      "job/..%2F..%2Fetc%2Fpasswd",
      "api/job/jobs/escape.yaml",
    ]) {
      const r = await http(`${shopServed.url}${p}`);
      expect(r.status, p).toBe(403);
    }
  });

  it("an oversized body is refused with 413 and nothing is run", async () => {
    const big = "# " + "x".repeat(70 * 1024) + "\n";
    const r = await http(`${shopServed.url}api/plan`, { method: "POST", body: big });
    expect(r.status).toBe(413);
    expect(JSON.parse(r.body).errors[0].code).toBe("body_too_large");
  });

  it("serving the network needs the token: 401 without, the link sets a cookie, Bearer works", async () => {
    const net = await serve({ dir: ROOT, port: 0, host: "0.0.0.0", token: "t0ken-for-the-test" });
    try {
      const port = new URL(net.url).port;
      const base = `http://127.0.0.1:${port}/`;
      expect(net.token).toBe("t0ken-for-the-test");
      expect((await http(`${base}api/check/jobs/blind-motor-0031.yaml`)).status).toBe(401);
      expect((await http(base, { headers: { authorization: "Bearer wrong" } })).status).toBe(401);
      const link = await http(`${base}?token=t0ken-for-the-test`);
      expect(link.status).toBe(303);
      const cookie = String(link.headers["set-cookie"]);
      expect(cookie).toMatch(/HttpOnly/);
      expect(cookie).toMatch(/SameSite=Strict/);
      const withCookie = await http(`${base}api/check/jobs/blind-motor-0031.yaml`, { headers: { cookie: cookie.split(";")[0] } });
      expect(withCookie.status).toBe(200);
      const bearer = await http(`${base}api/check/jobs/blind-motor-0031.yaml`, { headers: { authorization: "Bearer t0ken-for-the-test" } });
      expect(bearer.status).toBe(200);
      // a random token when none is given
      const other = await serve({ dir: ROOT, port: 0, host: "0.0.0.0" });
      expect(other.token).toMatch(/^[A-Za-z0-9_-]{24,}$/);
      await other.close();
    } finally {
      await net.close();
    }
  });
});

describe("saving a job", () => {
  const file = "jobs/blind-motor-0031.yaml";

  async function open(): Promise<{ text: string; version: string }> {
    const r = await http(`${shopServed.url}api/job/${file}`);
    expect(r.status).toBe(200);
    return JSON.parse(r.body);
  }

  it("keeps comments and order, and writes what the form changed", async () => {
    const before = await open();
    const edits = [{ path: "target.no_load_speed", text: "8500 rpm" }];
    const r = await http(`${shopServed.url}api/job/${file}`, { method: "PUT", body: JSON.stringify({ version: before.version, edits }) });
    expect(r.status).toBe(200);
    const after = readFileSync(join(shop, file), "utf8");
    expect(after).toContain("no_load_speed: 8500 rpm");
    // every comment line of the original is still there, in the same order
    const comments = (t: string) => t.split("\n").filter((l) => l.trim().startsWith("#"));
    expect(comments(after)).toEqual(comments(before.text));
    expect(after.replace("8500 rpm", "9000 rpm")).toBe(before.text);
  });

  it("refuses (409) a job changed on disk since it was opened, and writes nothing", async () => {
    const before = await open();
    const changed = before.text.replace("title:", "# edited in another window\ntitle:");
    writeFileSync(join(shop, file), changed);
    const r = await http(`${shopServed.url}api/job/${file}`, {
      method: "PUT",
      body: JSON.stringify({ version: before.version, edits: [{ path: "title", text: "mine" }] }),
    });
    expect(r.status).toBe(409);
    expect(JSON.parse(r.body).errors[0].code).toBe("changed_on_disk");
    expect(readFileSync(join(shop, file), "utf8")).toBe(changed);
  });

  it("refuses (422) a change that makes the job invalid, and writes nothing", async () => {
    const before = await open();
    const r = await http(`${shopServed.url}api/job/${file}`, {
      method: "PUT",
      body: JSON.stringify({ version: before.version, edits: [{ path: "armature.stack_length", text: "twelve mm" }] }),
    });
    expect(r.status).toBe(422);
    const e = JSON.parse(r.body).errors[0];
    expect(e).toMatchObject({ code: "bad_quantity", path: "armature.stack_length", file });
    expect(readFileSync(join(shop, file), "utf8")).toBe(before.text);
  });
});

describe("logging and new jobs", () => {
  const measured = (n: number) => ({
    version: 1,
    job: "blind-motor-0031",
    date: "2026-12-02",
    temperature: "21 C",
    meter_resolution: "0.001 ohm",
    // two different armatures (the same readings twice would be refused as already_logged)
    bar_to_bar: ["1.329", "1.327", "1.330", "1.330", `1.32${n}`],
    notes: `bench ${n} (invented)`,
  });

  it("two benches logging at once both land, each in its own record", async () => {
    const [a, b] = await Promise.all(
      [1, 2].map((n) => http(`${shopServed.url}api/log/jobs/blind-motor-0031.yaml`, { method: "POST", body: JSON.stringify(measured(n)) })),
    );
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    const files = [JSON.parse(a.body).file, JSON.parse(b.body).file];
    expect(new Set(files).size).toBe(2);
    for (const f of files) expect(readFileSync(join(shop, f), "utf8")).toContain("blind-motor-0031");
    const notes = files.map((f) => JSON.parse(readFileSync(join(shop, f), "utf8").replace(/^#.*\n/gm, "")).measured.notes).sort();
    expect(notes).toEqual(["bench 1 (invented)", "bench 2 (invented)"]);
  });

  it("a measured file that does not fit the job is 422 and nothing is logged", async () => {
    const before = (await http(`${shopServed.url}api/history`)).body;
    const r = await http(`${shopServed.url}api/log/jobs/blind-motor-0031.yaml`, {
      method: "POST",
      body: JSON.stringify({ ...measured(3), bar_to_bar: ["1.3", "1.3"] }),
    });
    expect(r.status).toBe(422);
    expect(JSON.parse(r.body).errors[0].code).toBe("readings_count");
    expect((await http(`${shopServed.url}api/history`)).body).toBe(before);
  });

  it("a new job starts from the template and checks as the CLI would", async () => {
    const r = await http(`${shopServed.url}api/new`, { method: "POST", body: JSON.stringify({ style: "lap", id: "web-new-0001" }) });
    expect(r.status).toBe(200);
    expect(readFileSync(join(shop, "jobs/web-new-0001.yaml"), "utf8")).toMatch(/^id: web-new-0001/m);
    const again = await http(`${shopServed.url}api/new`, { method: "POST", body: JSON.stringify({ style: "lap", id: "web-new-0001" }) });
    expect(JSON.parse(again.body).errors[0].code).toBe("file_exists");
  });
});

describe("armwind serve's own problems", () => {
  it("a port already in use is one line naming it and what to do, exit 1, not an internal error", async () => {
    const cli = await runMain(["serve", "--port", new URL(local.url).port]);
    expect(cli.status).toBe(1);
    expect(cli.stderr).toMatch(/the port is in use .* --port 0 for any free one \[port_in_use\]/);
    expect(cli.stderr).not.toContain("internal error");
  });
});
