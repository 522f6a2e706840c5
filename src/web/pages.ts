/**
 * The workbench's pages: plain server-rendered HTML (printable, fast on a tablet) with one small
 * script (static/app.js) that fetches the API and redraws the plan, the readings and the charts.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { parseDocument } from "yaml";
import { jobJsonSchema } from "../job/json-schema.js";
import { GOALS } from "../job/schema.js";
import { ArmwindError } from "../errors.js";
import { readUserFile } from "../files.js";
import { VERSION } from "../version.js";
import { insideDir, isRefusal } from "./guard.js";
import { jobForm, sectionLinks } from "./form.js";
import { esc } from "./html.js";
import { listJobs } from "./jobs.js";
import { versionOf } from "./api.js";
import { problem, type Context, type Req, type Res } from "./respond.js";

/** The folder of the page's script and style sheet (src/web/static, found from src/web or dist/web). */
const STATIC = fileURLToPath(new URL("../../src/web/static/", import.meta.url));
const TYPES: Record<string, string> = { js: "text/javascript; charset=utf-8", css: "text/css; charset=utf-8", svg: "image/svg+xml" };
const cache = new Map<string, Buffer>();

function asset(name: string): Res {
  if (!/^[a-z0-9-]+\.(js|css|svg)$/.test(name)) return problem(404, "not_found", "no such file");
  let body = cache.get(name);
  if (!body) {
    try {
      body = readFileSync(STATIC + name);
    } catch {
      return problem(404, "not_found", "no such file");
    }
    cache.set(name, body);
  }
  return { status: 200, type: TYPES[name.split(".").pop()!], body };
}

const html = (status: number, body: string): Res => ({ status, type: "text/html; charset=utf-8", body });

/** The frame every page shares: the bar of links, the style sheet and the script. */
export function layout(title: string, main: string, page: string, data: unknown = {}): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} · armwind</title><link rel="stylesheet" href="/static/style.css"></head>
<body data-page="${esc(page)}">
<header class="bar"><a class="brand" href="/">armwind</a><nav><a href="/">Jobs</a><a href="/new">New job</a><a href="/history">Logbook</a></nav></header>
<main>${main}</main>
<footer>armwind ${esc(VERSION)} · figures are planning aids; local codes and licensed practice come first.</footer>
<script type="application/json" id="page-data">${JSON.stringify(data).replace(/</g, "\\u003c")}</script>
<script src="/static/app.js" defer></script>
</body></html>`;
}

async function listPage(ctx: Context): Promise<Res> {
  const { jobs } = await listJobs(ctx.dir, { verdicts: false });
  const rows = jobs.map((j) => {
    const rec = j.last_record
      ? `${esc(j.last_record.date)} <span class="badge ${j.last_record.checks_ok ? "ok" : "bad"}">${j.last_record.checks_ok ? "checks passed" : "check failed"}</span>`
      : "—";
    const f = encodeURI(j.file);
    return `<tr><td><a class="job" href="/job/${f}">${esc(j.id ?? j.file)}</a><div class="sub">${esc(j.title ?? "")}</div><div class="sub file">${esc(j.file)}</div></td>
<td class="verdict-cell" data-check="${esc(j.file)}"><span class="sub">planning…</span></td>
<td>${rec}</td><td class="actions"><a href="/job/${f}">plan</a> <a href="/bench/${f}">readings</a> <a href="/card/${f}">card</a></td></tr>`;
  });
  const table = jobs.length
    ? `<table class="jobs"><thead><tr><th>job</th><th>last plan</th><th>last logbook record</th><th></th></tr></thead><tbody>${rows.join("\n")}</tbody></table>`
    : `<p>No job files in this folder yet. <a href="/new">Start one from a template.</a></p>`;
  return html(200, layout("Jobs", `<h1>Jobs</h1>${table}`, "list"));
}

function jobFile(ctx: Context, rel: string): { rel: string; abs: string; text: string } | Res {
  const f = insideDir(ctx.dir, rel);
  if (isRefusal(f)) return html(f.status, layout("Refused", `<h1>Refused</h1><p>${esc(f.message)}</p>`, "error"));
  try {
    return { ...f, text: readUserFile(f.abs, { name: f.rel }) };
  } catch (e) {
    const why = e instanceof ArmwindError ? e.problems[0].message : "cannot be read";
    return html(404, layout("Not found", `<h1>Cannot open ${esc(rel)}</h1><p>${esc(rel)}: ${esc(why)}</p>`, "error"));
  }
}

const isRes = (x: unknown): x is Res => typeof x === "object" && x !== null && "status" in x && "body" in x;

function jobPage(ctx: Context, rel: string): Res {
  const f = jobFile(ctx, rel);
  if (isRes(f)) return f;
  const doc = parseDocument(f.text);
  const form = doc.errors.length
    ? `<p class="problem">This file is not valid YAML (${esc(doc.errors[0].message.split("\n")[0])}); fix it in an editor, then reload.</p>`
    : jobForm(jobJsonSchema(), doc);
  const u = encodeURI(f.rel);
  const main = `<div class="head"><h1 id="title">${esc(String(doc.get("id") ?? f.rel))}</h1><span class="sub file">${esc(f.rel)}</span>
<nav class="tools"><a href="/card/${u}" id="card-link">card (PDF)</a><a href="/bench/${u}">readings at the bench</a><a href="/history${doc.getIn(["armature", "family"]) ? `?family=${encodeURIComponent(String(doc.getIn(["armature", "family"])))}` : ""}">logbook</a></nav></div>
<div class="split"><section class="form-col"><form id="job-form" autocomplete="off">
<div class="save-row"><button type="submit" id="save">Save</button><span id="save-status" role="status"></span><nav class="sections" aria-label="sections of the job">${sectionLinks(jobJsonSchema())}</nav></div>
<output class="problem" data-for=""></output>
${form}</form></section>
<section class="plan-col"><div id="plan" aria-live="polite"><p class="sub">planning…</p></div></section></div>`;
  return html(
    200,
    layout(String(doc.get("id") ?? f.rel), main, "job", {
      file: f.rel,
      text: f.text,
      version: versionOf(f.text),
      fixedGoal: (GOALS as readonly string[]).includes("fixed"),
    }),
  );
}

function benchPage(ctx: Context, rel: string): Res {
  const f = jobFile(ctx, rel);
  if (isRes(f)) return f;
  const doc = parseDocument(f.text);
  const id = String(doc.get("id") ?? "");
  const today = new Date().toISOString().slice(0, 10);
  const main = `<div class="head"><h1>Readings: ${esc(id)}</h1><span class="sub file">${esc(f.rel)}</span><nav class="tools"><a href="/job/${encodeURI(f.rel)}">plan</a><a href="/card/${encodeURI(f.rel)}">card (PDF)</a></nav></div>
<p class="caution">Null the test leads first. Read bar to bar stepping round the commutator: r1 between bar 1 and bar 2, … the last between the last bar and bar 1.</p>
<div class="split bench"><section class="grid-col"><form id="bench-form" autocomplete="off">
<div class="row"><label>date <input name="date" type="date" value="${today}"></label><label>winding temperature <input name="temperature" value="20 C" placeholder="21 C"></label><label>meter resolution (its last digit) <input name="meter_resolution" placeholder="0.1 ohm if not given"></label></div>
<div id="grid" class="readings"><p class="sub">loading the coil table…</p></div>
<output class="problem" data-for=""></output>
<fieldset><legend>more readings (optional)</legend>
<div class="row"><label>terminal resistance <input name="terminal_resistance" placeholder="1.57 ohm"></label></div>
<div class="row"><label>no-load supply <input name="nl_supply" placeholder="12 V"></label><label>current <input name="nl_current" placeholder="0.17 A"></label><label>speed <input name="nl_speed" placeholder="9650 rpm"></label></div>
<div class="row"><label>notes <input name="notes"></label></div></fieldset>
<div class="save-row"><button type="submit" id="log">Log this rewind</button><span id="log-status" role="status"></span></div><div id="log-result"></div>
</form></section>
<section class="diagram-col"><div id="verdict" aria-live="polite"></div><div id="diagram"></div></section></div>`;
  return html(200, layout(`Readings ${id}`, main, "bench", { file: f.rel, id }));
}

/** The card: the PDF the card command makes, shown in the page, with print, paper and download. */
function cardPage(ctx: Context, rel: string): Res {
  const f = jobFile(ctx, rel);
  if (isRes(f)) return f;
  const id = String(parseDocument(f.text).get("id") ?? f.rel);
  const u = encodeURI(f.rel);
  const main = `<div class="head"><h1>Card: ${esc(id)}</h1><span class="sub file">${esc(f.rel)}</span><nav class="tools"><a href="/job/${u}">plan</a><a href="/bench/${u}">readings at the bench</a></nav></div>
<div class="card-bar"><button type="button" id="print">Print the card</button>
<label>paper <select id="paper"><option value="">the shop's default</option><option value="a4">A4</option><option value="letter">Letter</option></select></label>
<a id="download" href="/api/card/${u}?download=1" download="${esc(id)}.pdf">download the PDF</a>
<a id="open" href="/api/card/${u}" target="_blank" rel="noopener">open it in its own tab</a><span id="card-status" role="status" class="sub">making the card…</span></div>
<iframe id="card" class="card-frame" title="the job card (PDF)" src="/api/card/${u}"></iframe>
<p class="sub">If the card does not show here, this browser has no PDF viewer: download it, or open it in its own tab, and print from there.</p>`;
  return html(200, layout(`Card ${id}`, main, "card", { file: f.rel, id }));
}

function newPage(): Res {
  const main = `<h1>New job</h1><form id="new-form" class="narrow"><p>A new job file starts from a template: every field is commented with what to measure, where and with what.</p>
<div class="row"><label>winding style <select name="style"><option value="tooth">tooth (3, 5, 7 slots)</option><option value="lap">lap</option><option value="wave">wave</option></select></label></div>
<div class="row"><label>job id <input name="id" required pattern="[A-Za-z0-9][A-Za-z0-9._\\-]*" placeholder="blind-motor-0032"></label></div>
<div class="save-row"><button type="submit">Create</button><span id="new-status" role="status"></span></div></form>`;
  return html(200, layout("New job", main, "new"));
}

function historyPage(r: Req): Res {
  const family = r.query.get("family") ?? "";
  const main = `<h1>Logbook</h1><form id="history-form" class="row"><label>family <select name="family" id="family"><option value="">all</option></select></label></form>
<figure id="history-plot"></figure><div id="history"><p class="sub">reading the logbook…</p></div>`;
  return html(200, layout("Logbook", main, "history", { family }));
}

/** Route a page. */
export async function handlePage(r: Req, ctx: Context): Promise<Res> {
  if (r.method !== "GET" && r.method !== "HEAD") return problem(405, "bad_request", "pages are read with GET");
  if (r.path === "/") return listPage(ctx);
  if (r.path === "/new") return newPage();
  if (r.path === "/favicon.ico") return { status: 204, type: "image/x-icon", body: "" };
  if (r.path === "/history") return historyPage(r);
  if (r.path.startsWith("/static/")) return asset(r.path.slice(8));
  if (r.path.startsWith("/job/")) return jobPage(ctx, r.path.slice(5));
  if (r.path.startsWith("/bench/")) return benchPage(ctx, r.path.slice(7));
  if (r.path.startsWith("/card/")) return cardPage(ctx, r.path.slice(6));
  return html(404, layout("Not found", `<h1>Not found</h1><p>No page at ${esc(r.path)}. <a href="/">The job list.</a></p>`, "error"));
}
