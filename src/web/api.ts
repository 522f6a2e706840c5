/**
 * The workbench's API: each endpoint runs the CLI command it stands for, in-process, with the shop
 * folder as working folder, and answers with exactly what that command prints with `--json`
 * (docs/contracts.md, the workbench's HTTP contract). Only the job file's editing (open, preview, save with
 * the changed-on-disk check) is the workbench's own.
 */
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { ArmwindError } from "../errors.js";
import { writeAtomic } from "../cli/write.js";
import { readUserFile } from "../files.js";
import { httpStatus, runCli, type CliRun } from "./cli-run.js";
import { insideDir, isRefusal } from "./guard.js";
import { applyEdits, type FieldEdit } from "./edit.js";
import { listJobs } from "./jobs.js";
import { json, problem, type Context, type Req, type Res } from "./respond.js";

/** The CLI's answer as an HTTP response: its JSON unchanged, the status from its exit status. */
export function cliResponse(run: CliRun): Res {
  if (!run.stdout.trim()) return problem(httpStatus(run.status), "internal_error", run.stderr.trim() || "the command printed nothing");
  return { status: httpStatus(run.status), type: "application/json; charset=utf-8", body: run.stdout };
}

/** A version of a job file's text: changes when the file changes. */
export function versionOf(text: string | Buffer): string {
  return createHash("sha256").update(text).digest("hex").slice(0, 20);
}

/** An ArmwindError as the CLI's `--json` error object. */
const errorBody = (e: ArmwindError) => ({
  ok: false,
  errors: e.problems.map((p) => ({ code: p.code, message: p.message, file: p.file ?? null, line: p.line ?? null, column: p.column ?? null, path: p.path })),
});

function errorResponse(e: unknown): Res {
  if (e instanceof ArmwindError) return json(httpStatus(e.status), errorBody(e));
  throw e;
}

function parseBody<T>(r: Req): T | Res {
  try {
    return JSON.parse(r.body.toString("utf8")) as T;
  } catch {
    return problem(400, "bad_request", "the request body is not JSON");
  }
}

const isRes = (x: unknown): x is Res => typeof x === "object" && x !== null && "status" in x && "body" in x && "type" in x;

/** `/api/<command>/<file>` → the file (403 when it leaves the folder). */
function fileOf(ctx: Context, rest: string): { rel: string; abs: string } | Res {
  const f = insideDir(ctx.dir, rest);
  return isRefusal(f) ? problem(f.status, f.code, f.message) : f;
}

/** Read a job file for editing: its text and version (a regular file, size-limited, as the CLI reads). */
function openJob(abs: string, rel: string): { text: string; version: string } | Res {
  try {
    const text = readUserFile(abs, { name: rel });
    return { text, version: versionOf(text) };
  } catch (e) {
    if (e instanceof ArmwindError) return json(e.problems[0].code === "file_unreadable" ? 404 : 422, errorBody(e));
    throw e;
  }
}

/** Errors of a command fed the edited text on standard input are the file's own: name it. */
function asFile(run: CliRun, rel: string): CliRun {
  return { ...run, stdout: run.stdout.replaceAll('"file": "<stdin>"', `"file": ${JSON.stringify(rel)}`) };
}

async function saveJob(r: Req, ctx: Context, f: { rel: string; abs: string }): Promise<Res> {
  const b = parseBody<{ version?: string; edits?: FieldEdit[]; text?: string }>(r);
  if (isRes(b)) return b;
  const cur = openJob(f.abs, f.rel);
  if (isRes(cur)) return cur;
  if (b.version !== cur.version) {
    return json(409, {
      ok: false,
      errors: [
        {
          code: "changed_on_disk",
          message: `${f.rel} changed on disk since you opened it; nothing was saved: reload it (your changes are still in the form) and save again`,
          file: f.rel,
          line: null,
          column: null,
          path: "",
        },
      ],
    });
  }
  let text: string;
  try {
    text = b.text ?? applyEdits(cur.text, b.edits ?? []);
  } catch (e) {
    return errorResponse(e);
  }
  const checked = asFile(await runCli(ctx.dir, ["check", "-", "--json"], text), f.rel);
  if (checked.status === 1 || checked.status >= 3) return cliResponse(checked);
  try {
    await writeAtomic(f.abs, text);
  } catch (e) {
    return errorResponse(e);
  }
  return json(200, { ok: true, file: f.rel, version: versionOf(text), text, check: JSON.parse(checked.stdout) });
}

async function preview(r: Req, ctx: Context, f: { rel: string; abs: string }): Promise<Res> {
  const b = parseBody<{ text?: string; edits?: FieldEdit[] }>(r);
  if (isRes(b)) return b;
  let base = b.text;
  if (base === undefined) {
    const cur = openJob(f.abs, f.rel);
    if (isRes(cur)) return cur;
    base = cur.text;
  }
  let text: string;
  try {
    text = applyEdits(base, b.edits ?? []);
  } catch (e) {
    return errorResponse(e);
  }
  return cliResponse(asFile(await runCli(ctx.dir, ["plan", "-", "--json"], text), f.rel));
}

async function card(r: Req, ctx: Context, f: { rel: string }): Promise<Res> {
  // the paper as asked, else the CLI's own default (ARMWIND_PAPER, the shop profile's, A4)
  const paper = r.query.get("paper");
  const out = mkdtempSync(join(tmpdir(), "armwind-card-"));
  try {
    const run = await runCli(ctx.dir, ["card", f.rel, "-o", out, ...(paper === "a4" || paper === "letter" ? ["--paper", paper] : []), "--json"]);
    if (httpStatus(run.status) !== 200) return cliResponse(run);
    const made = JSON.parse(run.stdout) as { card: string; plan: { job_id: string } };
    return {
      status: 200,
      type: "application/pdf",
      body: readFileSync(made.card),
      headers: {
        "content-disposition": `${r.query.get("download") === "1" ? "attachment" : "inline"}; filename="${made.plan.job_id}.pdf"`,
        // the card page shows it in a frame: its own pages may frame it, no other site
        "x-frame-options": "SAMEORIGIN",
        "content-security-policy": "default-src 'self'; frame-ancestors 'self'",
      },
    };
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}

async function historySvg(r: Req, ctx: Context): Promise<Res> {
  const out = mkdtempSync(join(tmpdir(), "armwind-history-"));
  try {
    const family = r.query.get("family");
    const run = await runCli(ctx.dir, ["history", "--json", `--plot=${join(out, "history.svg")}`, ...(family ? [`--family=${family}`] : [])]);
    if (httpStatus(run.status) !== 200) return cliResponse(run);
    return { status: 200, type: "image/svg+xml", body: readFileSync(join(out, "history.svg")) };
  } catch {
    return problem(404, "no_records", "no logbook records to plot");
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}

/** Readings typed at the bench → `diagnose JOB --bars … --temperature … --json` (with `--partial` while some are blank). */
async function diagnoseReadings(r: Req, ctx: Context, f: { rel: string }): Promise<Res> {
  const b = parseBody<{ bars?: unknown[]; temperature?: string; resolution?: string; tolerance?: number; partial?: boolean }>(r);
  if (isRes(b)) return b;
  const bars = (b.bars ?? []).map((x) =>
    String(x ?? "")
      .trim()
      .replace(/,/g, "."),
  );
  const args = ["diagnose", f.rel, `--bars=${bars.join(",")}`, "--json"];
  if (b.partial === true) args.push("--partial");
  if (b.temperature) args.push(`--temperature=${b.temperature}`);
  if (b.resolution) args.push(`--resolution=${b.resolution}`);
  if (typeof b.tolerance === "number") args.push(`--tolerance=${b.tolerance}`);
  return cliResponse(await runCli(ctx.dir, args));
}

/** Route `/api/…`. */
export async function handleApi(r: Req, ctx: Context): Promise<Res> {
  const m = /^\/api\/([a-z-]+)(?:\/(.*))?$/.exec(r.path);
  if (!m) return problem(404, "not_found", `no such endpoint: ${r.path}`);
  const [, what, rest] = m;
  const stdin = r.body.toString("utf8");
  if ((what === "plan" || what === "check") && rest === undefined && r.method === "POST")
    return cliResponse(await runCli(ctx.dir, [what, "-", "--json"], stdin));
  if (what === "jobs" && r.method === "GET") return json(200, await listJobs(ctx.dir));
  if (what === "wires" && r.method === "GET") return cliResponse(await runCli(ctx.dir, ["wires", "--json"]));
  if (what === "history" && r.method === "GET") {
    const family = r.query.get("family");
    return cliResponse(await runCli(ctx.dir, ["history", "--json", ...(family ? [`--family=${family}`] : [])]));
  }
  if (what === "history-svg" && r.method === "GET") return historySvg(r, ctx);
  if (what === "new" && r.method === "POST") {
    const b = parseBody<{ style?: string; id?: string }>(r);
    if (isRes(b)) return b;
    return cliResponse(
      await runCli(ctx.dir, [
        "new",
        `--style=${b.style ?? ""}`,
        `--id=${b.id ?? ""}`,
        `--output=jobs/${/^[A-Za-z0-9._-]+$/.test(b.id ?? "") ? b.id : "job"}.yaml`,
        "--json",
      ]),
    );
  }
  if (rest === undefined) return problem(404, "not_found", `no such endpoint: ${r.path}`);
  const f = fileOf(ctx, rest);
  if (isRes(f)) return f;
  return fileEndpoint(what, r, ctx, f);
}

async function fileEndpoint(what: string, r: Req, ctx: Context, f: { rel: string; abs: string }): Promise<Res> {
  const key = `${r.method} ${what}`;
  switch (key) {
    case "GET plan":
    case "GET check":
      return cliResponse(await runCli(ctx.dir, [what, f.rel, "--json"]));
    case "GET job": {
      const cur = openJob(f.abs, f.rel);
      return isRes(cur) ? cur : json(200, { ok: true, file: f.rel, ...cur });
    }
    case "PUT job":
      return saveJob(r, ctx, f);
    case "POST preview":
      return preview(r, ctx, f);
    case "POST diagnose":
      return diagnoseReadings(r, ctx, f);
    case "POST log":
      // ?again=1: the user chose to log the same readings a second time (`log --again`)
      return cliResponse(
        await runCli(ctx.dir, ["log", f.rel, "--measured=-", "--json", ...(r.query.get("again") === "1" ? ["--again"] : [])], r.body.toString("utf8")),
      );
    case "GET card":
      return card(r, ctx, f);
    default:
      return problem(404, "not_found", `no such endpoint: ${r.method} /api/${what}/…`);
  }
}
