// armwind workbench: the one small script of the pages. It draws what the API answers (the CLI's
// own --json output) and sends what the user types; every figure, rule and verdict comes from the
// server. Plain browser JavaScript, no build step.

const $ = (sel, root = document) => root.querySelector(sel);
const $$ = (sel, root = document) => Array.from(root.querySelectorAll(sel));
const data = JSON.parse(($("#page-data") || { textContent: "{}" }).textContent || "{}");
const SVGNS = "http://www.w3.org/2000/svg";

function h(tag, attrs = {}, ...kids) {
  const e = tag.startsWith("svg:") ? document.createElementNS(SVGNS, tag.slice(4)) : document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined || v === null || v === false) continue;
    if (k.startsWith("on")) e.addEventListener(k.slice(2), v);
    else e.setAttribute(k, String(v));
  }
  for (const k of kids.flat()) if (k !== undefined && k !== null && k !== false) e.append(k instanceof Node ? k : String(k));
  return e;
}

/** 3 significant figures (resistance: 4), "—" for an unknown figure, as the terminal prints. */
function fmt(x, digits = 3) {
  if (x === null || x === undefined || Number.isNaN(x)) return "—";
  if (typeof x !== "number") return String(x);
  if (x === 0) return "0";
  const p = Number(x.toPrecision(digits));
  return Math.abs(p) >= 1e5 || Math.abs(p) < 1e-3 ? p.toExponential(digits - 1) : String(p);
}
const pct = (x) => (x === null || x === undefined ? "—" : `${fmt(x * 100)} %`);
const enc = (file) => file.split("/").map(encodeURIComponent).join("/");

async function api(method, url, body) {
  const init = { method, headers: {} };
  if (body !== undefined) {
    init.body = typeof body === "string" ? body : JSON.stringify(body);
    init.headers["content-type"] = typeof body === "string" ? "application/yaml" : "application/json";
  }
  const r = await fetch(url, init);
  let json = null;
  try {
    json = await r.json();
  } catch {
    json = { ok: false, errors: [{ code: "bad_answer", message: `the server answered ${r.status} without JSON`, path: "" }] };
  }
  return { status: r.status, json };
}

function debounce(fn, ms) {
  let t;
  return (...a) => {
    clearTimeout(t);
    t = setTimeout(() => fn(...a), ms);
  };
}

/** Show each problem at its field: the output for its path, else its nearest parent's, else the form's. */
function showProblems(form, problems, kind = "error") {
  for (const o of $$("output.problem", form)) if (o.dataset.kind === kind || !o.dataset.kind) (o.textContent = ""), delete o.dataset.kind;
  for (const f of $$(".field.has-problem, fieldset.has-problem", form)) f.classList.remove("has-problem");
  for (const p of problems) {
    let path = p.path || "";
    let out = null;
    for (;;) {
      out = form.querySelector(`output.problem[data-for="${CSS.escape(path)}"]`);
      if (out || path === "") break;
      path = path.replace(/(\.[^.[\]]+|\[\d+\])$|^[^.[\]]+$/, "");
    }
    if (!out) continue;
    if (out.dataset.kind && out.dataset.kind !== kind) continue;
    out.dataset.kind = kind;
    out.append(h("span", { class: kind }, `${p.message} [${p.code}]`));
    out.closest(".field, fieldset")?.classList.add("has-problem");
  }
}

// ---------------------------------------------------------------- the job page: form, plan, chart

const job = { edits: [], seq: 0, shown: 0, plan: null, picked: null };

/**
 * The form's edits, in the order made: each a field's text at its path, or a structural one (a list
 * row added or removed, a union switched to another form). Typing again in a field replaces its last
 * edit unless a structural edit came after it (then the paths may mean other rows: a new edit).
 */
function setEdit(path, text, structural = false) {
  const last = job.edits.findLastIndex((e) => e.path === path);
  const laterStructural = job.edits.slice(last + 1).some((e) => e.structural);
  if (!structural && last >= 0 && !laterStructural && !job.edits[last].structural) job.edits[last].text = text;
  else job.edits.push({ path, text, structural });
  $("#save-status").textContent = "unsaved changes";
  $("#save-status").className = "";
}

function fieldEdits() {
  return job.edits.map(({ path, text }) => ({ path, text }));
}

/** A typed value as it goes into a one-line { … } map: as typed, or quoted when it holds YAML's flow signs. */
function flowScalar(text) {
  const t = text.trim();
  return /[,[\]{}#&*!|>'"%@`]|: |^-|^\?/.test(t) ? JSON.stringify(t) : t;
}

/** The value the controls under `base` say, as one line of YAML: the shown variant's map, or the one text box. */
function compose(container, base) {
  const own = container.querySelector(`[data-field="${CSS.escape(base)}"]`);
  if (own && !own.closest("[hidden]")) return own.value.trim() === "" ? "''" : flowScalar(own.value);
  const entries = [];
  for (const el of $$("[data-field]", container)) {
    if (el.closest("[hidden]")) continue;
    const p = el.dataset.field;
    if (!p.startsWith(`${base}.`) || el.value.trim() === "") continue;
    const rest = p.slice(base.length + 1);
    if (/[.[]/.test(rest)) continue; // a deeper field: composed with its own union
    entries.push(`${rest}: ${flowScalar(el.value)}`);
  }
  for (const u of $$("[data-union]", container)) {
    const p = u.dataset.union;
    if (u.closest("[hidden]") || !p.startsWith(`${base}.`) || /[.[]/.test(p.slice(base.length + 1))) continue;
    entries.push(`${p.slice(base.length + 1)}: ${compose(u, p)}`);
  }
  return entries.length ? `{ ${entries.join(", ")} }` : "{}";
}

/** The list row (not yet in the file) a control belongs to, if any. */
const newRow = (el) => el.closest(".list-item[data-new]");

function fieldChanged(f) {
  const row = newRow(f);
  if (row) setEdit(row.dataset.item, compose(row, row.dataset.item));
  else setEdit(f.dataset.field, f.value);
  if (SCOPING.has(f.dataset.field)) showScopedFields();
  previewSoon();
}

/** Show the union's variant k; with `carry`, the value moves over (a bare value into the map's first field, or back). */
function showVariant(u, k, carry) {
  const variants = $$(":scope > .variant", u);
  const from = variants.find((v) => !v.hidden);
  const to = variants[k];
  // a form's fixed field (a test's kind, in a hidden control) is the choice itself, never a value to carry
  const typed = (v) => $$("[data-field]:not([data-fixed])", v);
  const shared = carry && from && from !== to ? typed(to).filter((e) => typed(from).some((f) => f.dataset.field === e.dataset.field)) : [];
  if (shared.length) {
    // two forms of one map (a no-load and a load test): the fields they share keep their values
    for (const e of shared) e.value = typed(from).find((f) => f.dataset.field === e.dataset.field).value;
  } else if (carry && from && from !== to && !typed(to).some((e) => e.value.trim() !== "")) {
    // only a plain quantity carries over ("230 V", "0.03"): a wire's name is not a measured diameter
    const src = typed(from).find((e) => /^\s*[+-]?(\d+\.?\d*|\.\d+)\s*[^\s\d]*\s*$/.test(e.value));
    const inputs = $$("input[data-field]:not([data-fixed])", to);
    // a bare value goes into the map's required fields (the value, the bare diameter), or into each when none is required (below and above)
    const required = inputs.filter((e) => !e.closest(".field")?.querySelector("label .opt"));
    if (src) for (const e of (required.length ? required : inputs).slice(0, to.querySelector(".subfields") ? 2 : 1)) e.value = src.value;
  }
  variants.forEach((v, i) => (v.hidden = i !== k));
  const radio = u.querySelector(`[data-variant-of="${CSS.escape(u.dataset.union)}"][value="${k}"]`);
  if (radio) radio.checked = true;
}

function variantChanged(radio) {
  const u = radio.closest("[data-union]");
  showVariant(u, Number(radio.value), true);
  const row = newRow(u);
  if (row) setEdit(row.dataset.item, compose(row, row.dataset.item));
  else setEdit(u.dataset.union, compose(u, u.dataset.union), true);
  previewSoon();
}

const sanitized = (p) => `f-${p.replace(/[^A-Za-z0-9_-]/g, "_")}`;

/** Give a row the paths of index `to` (it was at `from`): every path, id and name under it. */
function renumber(row, list, from, to) {
  const a = `${list}[${from}]`;
  const b = `${list}[${to}]`;
  const sa = sanitized(a);
  const sb = sanitized(b);
  for (const el of [row, ...$$("*", row)]) {
    for (const attr of ["data-item", "data-field", "data-path", "data-for", "data-union", "data-variant-of", "name"]) {
      const v = el.getAttribute(attr);
      if (v !== null) el.setAttribute(attr, v.replace(a, b));
    }
    for (const attr of ["id", "for"]) {
      const v = el.getAttribute(attr);
      if (v?.startsWith(sa)) el.setAttribute(attr, sb + v.slice(sa.length));
    }
  }
  for (const l of $$("legend, .label", row)) l.textContent = l.textContent.replace(/^item \S+/, `item ${to + 1}`);
}

function addRow(fs) {
  const list = fs.dataset.list;
  const box = $(":scope > .list-items", fs);
  const n = box.children.length;
  if (fs.dataset.max && n >= Number(fs.dataset.max)) return;
  const html = $(":scope > template", fs)
    .innerHTML.replaceAll(`${list}[#]`, `${list}[${n}]`)
    .replaceAll(sanitized(`${list}[#]`), sanitized(`${list}[${n}]`))
    .replaceAll("item #", `item ${n + 1}`);
  box.insertAdjacentHTML("beforeend", html);
  const row = box.lastElementChild;
  setEdit(`${list}[${n}]`, compose(row, `${list}[${n}]`), true);
  row.querySelector("input, select")?.focus();
  previewSoon();
}

function removeRow(row) {
  const fs = row.closest("[data-list]");
  const list = fs.dataset.list;
  const rows = $$(":scope > .list-items > .list-item", fs);
  const i = rows.indexOf(row);
  setEdit(`${list}[${i}]`, "", true);
  row.remove();
  for (let j = i + 1; j < rows.length; j++) renumber(rows[j], list, j, j - 1);
  previewSoon();
}

/**
 * Fields that only one goal reads are shown with that goal (all of them while no goal is chosen);
 * fields that only one kind of motor field reads (a shunt field's current) with that armature.field.
 */
function showScopedFields() {
  const goal = $('[data-field="target.goal"]')?.value ?? "";
  for (const el of $$("[data-goal]")) el.classList.toggle("other-goal", goal !== "" && el.dataset.goal !== goal);
  const field = $('[data-field="armature.field"]')?.value ?? "";
  for (const el of $$("[data-motor-field]")) el.classList.toggle("other-field", field !== "" && el.dataset.motorField !== field);
}

/** The fields whose value decides which other fields are shown. */
const SCOPING = new Set(["target.goal", "armature.field"]);

async function preview() {
  const seq = ++job.seq;
  const t0 = performance.now();
  const { status, json } = await api("POST", `/api/preview/${enc(data.file)}`, { text: data.text, edits: fieldEdits() });
  if (seq < job.shown) return;
  job.shown = seq;
  const form = $("#job-form");
  if (status === 200) {
    showProblems(form, []);
    showProblems(form, json.warnings || [], "warning");
    renderPlan(json);
  } else {
    showProblems(form, json.errors || []);
    $("#plan").classList.add("stale");
  }
  document.body.dataset.previewMs = String(Math.round(performance.now() - t0));
  document.body.dataset.previewSeq = String(seq);
}
const previewSoon = debounce(preview, 120);

function setField(path, text) {
  const input = $(`[data-field="${CSS.escape(path)}"]`);
  if (input) {
    const v = input.closest(".variant");
    if (v?.hidden) showVariant(v.closest("[data-union]"), Number(v.dataset.variant), false);
    input.value = text;
  }
  setEdit(path, text);
  if (SCOPING.has(path)) showScopedFields();
}

function initJob() {
  const form = $("#job-form");
  if (!form) return;
  showScopedFields();
  form.addEventListener("input", (ev) => {
    if (ev.target.dataset.variantOf !== undefined) return variantChanged(ev.target);
    const f = ev.target.closest("[data-field]");
    if (f) fieldChanged(f);
  });
  form.addEventListener("click", (ev) => {
    const add = ev.target.closest("[data-add]");
    if (add) return addRow(add.closest("[data-list]"));
    const rm = ev.target.closest("[data-remove]");
    if (rm) removeRow(rm.closest(".list-item"));
  });
  form.addEventListener("submit", async (ev) => {
    ev.preventDefault();
    const { status, json } = await api("PUT", `/api/job/${enc(data.file)}`, { version: data.version, edits: fieldEdits() });
    const s = $("#save-status");
    if (status === 200) {
      data.text = json.text;
      data.version = json.version;
      job.edits = [];
      for (const r of $$(".list-item[data-new]")) delete r.dataset.new;
      s.textContent = "saved";
      s.className = "ok";
    } else {
      s.textContent =
        status === 409
          ? "not saved: the file changed on disk since you opened it; reload the page (copy your changes first)"
          : "not saved: fix the fields marked in red";
      s.className = "bad";
      showProblems(form, json.errors || []);
    }
  });
  preview();
}

function row(label, a, b, unit = "") {
  return h("tr", {}, h("th", {}, label), h("td", {}, a), h("td", {}, b), h("td", { class: "unit" }, unit));
}

function windingLine(turns, wire, strands) {
  return `${turns} turns of ${wire}${strands > 1 ? ` × ${strands} in hand` : ""}`;
}

function renderPlan(p) {
  job.plan = p;
  const box = $("#plan");
  box.classList.remove("stale");
  box.replaceChildren();
  const d = p.design;
  const o = p.original || {};
  box.append(
    h("p", { class: `verdict ${p.feasible ? "ok" : "warn"}` }, p.feasible ? "meets the goal" : "no winding meets the goal: the closest is shown"),
    h("p", { class: "big", id: "chosen" }, windingLine(d.turns_per_coil, d.wire.label, d.strands_in_hand)),
    h(
      "p",
      { class: "goal" },
      `${p.goal.kind.replace(/_/g, " ")}: ${p.goal.summary || `${fmt(p.goal.achieved_value)} against ${fmt(p.goal.target_value)} ${p.goal.unit}`}`,
    ),
  );
  const m = p.motor || {};
  const om = p.original_motor || {};
  const r = p.resistance || {};
  const t = h("table", { class: "compare" }, h("thead", {}, h("tr", {}, h("th"), h("th", {}, "original"), h("th", {}, "new"), h("th"))));
  const tb = h("tbody");
  tb.append(
    row(
      "winding",
      o.turns_per_coil ? windingLine(o.turns_per_coil, o.wire?.label ?? "", o.strands_in_hand ?? 1) : "—",
      windingLine(d.turns_per_coil, d.wire.label, d.strands_in_hand),
    ),
    row("copper fill", pct(o.copper_fill), pct(d.copper_fill)),
    row("terminal resistance (20 °C)", fmt(o.terminal_ohm, 4), fmt(r.terminal_ohm, 4), "Ω"),
    row("bar to bar (20 °C)", "", fmt(r.bar_to_bar_ohm, 4), "Ω"),
    row("Kv (motor constant)", fmt(om.kv_rpm_per_v), fmt(m.kv_rpm_per_v), "rpm/V"),
    row("no-load speed", fmt(om.no_load_speed_rpm), fmt(m.no_load_speed_rpm), "rpm"),
    row("no-load current", fmt(om.no_load_current_a), fmt(m.no_load_current_a), "A"),
    row("stall current (hot)", fmt(om.stall_current_a), fmt(m.stall_current_a), "A"),
    row("stall torque", fmt(om.stall_torque_n_m), fmt(m.stall_torque_n_m), "N·m"),
    row("peak efficiency", pct(om.peak_efficiency), pct(m.peak_efficiency)),
    row("wire to cut (all strands)", "", fmt(p.wire?.cut_m), "m"),
  );
  t.append(tb);
  box.append(t);
  if (p.warnings?.length)
    box.append(
      h("h3", {}, "Warnings"),
      h(
        "ul",
        { class: "warnings" },
        p.warnings.map((w) => h("li", {}, `${w.path ? w.path + ": " : ""}${w.message} [${w.code}]`)),
      ),
    );
  box.append(h("h3", {}, `Candidates (${p.candidates.length} shown of ${p.candidates_total})`), candidateChart(p), h("div", { id: "picked" }));
}

/** Turns (across) against wire and strands (up, thinner to thicker copper), each candidate marked by verdict. */
function candidateChart(p) {
  const cands = p.candidates;
  const key = (c) => `${c.wire}${c.strands_in_hand > 1 ? ` ×${c.strands_in_hand}` : ""}`;
  // copper per turn grows as resistance per turn falls: order the rows by it (figures from the plan)
  const perTurn = new Map();
  for (const c of cands) perTurn.set(key(c), Math.min(perTurn.get(key(c)) ?? Infinity, c.terminal_ohm / c.turns_per_coil));
  const rows = Array.from(perTurn.keys()).sort((a, b) => perTurn.get(b) - perTurn.get(a));
  const turns = cands.map((c) => c.turns_per_coil);
  const lo = Math.min(...turns) - 1;
  const hi = Math.max(...turns) + 1;
  const W = 640,
    L = 150,
    T = 10,
    rowH = 26,
    H = T + rows.length * rowH + 40;
  const x = (n) => L + ((n - lo) / (hi - lo || 1)) * (W - L - 20);
  const y = (k) => T + rows.indexOf(k) * rowH + rowH / 2;
  const svg = h("svg:svg", { viewBox: `0 0 ${W} ${H}`, class: "chart", role: "img", "aria-label": "candidates: turns against wire" });
  rows.forEach((k) => {
    svg.append(
      h("svg:line", { x1: L, x2: W - 20, y1: y(k), y2: y(k), class: "gridline" }),
      h("svg:text", { x: L - 8, y: y(k) + 4, "text-anchor": "end", class: "label" }, k),
    );
  });
  const step = Math.max(1, Math.ceil((hi - lo) / 10));
  for (let n = Math.ceil(lo); n <= hi; n += step) svg.append(h("svg:text", { x: x(n), y: H - 22, "text-anchor": "middle", class: "label" }, String(n)));
  svg.append(h("svg:text", { x: (L + W) / 2, y: H - 4, "text-anchor": "middle", class: "label" }, "turns per coil"));
  const chosen = p.design;
  for (const c of cands) {
    const isChosen = c.turns_per_coil === chosen.turns_per_coil && c.wire === chosen.wire.label && c.strands_in_hand === chosen.strands_in_hand;
    const cls = isChosen ? "chosen" : c.meets_goal && !c.rejected_because.length ? "meets" : c.rejected_because.length ? "rejected" : "misses";
    const why = c.rejected_because.length ? `rejected: ${c.rejected_because.join(", ")}` : c.meets_goal ? "meets the goal" : "misses the goal";
    const mark = h(
      "svg:circle",
      {
        cx: x(c.turns_per_coil),
        cy: y(key(c)),
        r: isChosen ? 9 : 6,
        class: `cand ${cls}`,
        tabindex: 0,
        "data-turns": c.turns_per_coil,
        "data-wire": c.wire,
        "data-strands": c.strands_in_hand,
        onclick: () => pick(c),
        onkeydown: (e) => e.key === "Enter" && pick(c),
      },
      h("svg:title", {}, `${windingLine(c.turns_per_coil, c.wire, c.strands_in_hand)}: ${fmt(c.achieved_value)} ${p.goal.unit}; ${why}`),
    );
    svg.append(mark);
  }
  const legend = h(
    "p",
    { class: "legend" },
    h("span", { class: "dot chosen" }),
    " chosen ",
    h("span", { class: "dot meets" }),
    " meets the goal ",
    h("span", { class: "dot misses" }),
    " misses it ",
    h("span", { class: "dot rejected" }),
    " rejected (tap for the reason)",
  );
  return h("div", {}, svg, legend);
}

function pick(c) {
  job.picked = c;
  const p = job.plan;
  const box = $("#picked");
  const reasons = c.rejected_because.length ? c.rejected_because.join(", ") : "none";
  box.replaceChildren(
    h("h3", {}, windingLine(c.turns_per_coil, c.wire, c.strands_in_hand)),
    h(
      "table",
      { class: "compare" },
      h(
        "tbody",
        {},
        row(p.goal.kind.replace(/_/g, " "), "", fmt(c.achieved_value), p.goal.unit),
        row("copper fill", "", pct(c.copper_fill)),
        row("space fill", "", pct(c.space_fill)),
        row("terminal resistance (20 °C)", "", fmt(c.terminal_ohm, 4), "Ω"),
        row("Kv", "", fmt(c.kv_rpm_per_v), "rpm/V"),
        row("stall current (hot)", "", fmt(c.stall_current_hot_a), "A"),
        row("copper mass", "", fmt(c.copper_mass_g), "g"),
        row("rejected because", "", reasons),
      ),
    ),
  );
  if (data.fixedGoal) {
    box.append(
      h(
        "button",
        {
          type: "button",
          id: "fix",
          onclick: () => {
            setField("target.goal", "fixed");
            // the form has a field for each part of `fixed` when the schema describes it as a map
            if ($('[data-field="target.fixed.turns"]')) {
              setField("target.fixed.turns", String(c.turns_per_coil));
              setField("target.fixed.wire", c.wire);
              setField("target.fixed.strands", String(c.strands_in_hand));
            } else setField("target.fixed", `{ turns: ${c.turns_per_coil}, wire: ${c.wire}, strands: ${c.strands_in_hand} }`);
            $("#save-status").textContent = "unsaved changes";
            preview();
          },
        },
        "Fix this winding into the job (goal: fixed)",
      ),
    );
  } else box.append(h("p", { class: "sub" }, "Fixing a chosen winding into the job needs goal: fixed, which this version of armwind does not have yet."));
}

// ---------------------------------------------------------------- readings at the bench

const bench = { plan: null, seq: 0, shown: 0, last: null };

async function initBench() {
  const { status, json } = await api("GET", `/api/plan/${enc(data.file)}`);
  const grid = $("#grid");
  if (status !== 200) {
    grid.replaceChildren(h("p", { class: "problem" }, (json.errors || []).map((e) => `${e.message} [${e.code}]`).join("; ") || "the job cannot be planned"));
    return;
  }
  bench.plan = json;
  const live = json.coils.filter((c) => !c.dead);
  const C = Math.max(...live.map((c) => Math.max(c.start_bar, c.end_bar)));
  bench.bars = C;
  const expected = json.resistance?.bar_to_bar_ohm;
  grid.replaceChildren(
    ...Array.from({ length: C }, (_, i) =>
      h(
        "label",
        { class: "reading", "data-index": i },
        h("span", { class: "r" }, `r${i + 1}`),
        h("span", { class: "bars" }, `bar ${i + 1}–${i + 2 > C ? 1 : i + 2}`),
        h("input", {
          name: `r${i + 1}`,
          "data-reading": i,
          inputmode: "decimal",
          // what the plan expects between these two bars (lap coils laid later are longer)
          placeholder: fmt(json.resistance?.bar_to_bar_each_ohm?.[i] ?? expected, 4),
          title: "the plan's expected reading at 20 °C",
          autocomplete: "off",
        }),
        h("span", { class: "judge" }),
      ),
    ),
  );
  drawDiagram([]);
  judge();
  const form = $("#bench-form");
  form.addEventListener("input", debounce(judge, 150));
  form.addEventListener("submit", (ev) => {
    ev.preventDefault();
    logRecord();
  });
}

function readings() {
  return $$("[data-reading]").map((i) => i.value.trim());
}

/** The sign and size of a fraction, in per cent: "+2.1 %", "−7.2 %". */
const signed = (x) => (Math.abs(x) < 5e-4 ? "0 %" : `${x >= 0 ? "+" : "−"}${fmt(Math.abs(x) * 100, 2)} %`);

/**
 * Judge the readings as they are typed: while some are blank, `diagnose --partial` (each reading
 * alone against the plan; from three on against their median, and the coils behind them); with
 * all of them, `diagnose` itself. Every verdict comes from the server.
 */
async function judge() {
  const rs = readings();
  const form = $("#bench-form");
  const typed = rs.filter((r) => r !== "").length;
  if (typed === 0) {
    $("#verdict").replaceChildren(h("p", { class: "sub" }, "Type the readings as you take them: each is judged as it comes in."));
    for (const l of $$(".reading")) l.classList.remove("fail", "pass", "invalid", "hint"), ($(".judge", l).textContent = "");
    drawDiagram([]);
    return;
  }
  const seq = ++bench.seq;
  const temperature = form.elements.temperature.value.trim();
  const { status, json } = await api("POST", `/api/diagnose/${enc(data.file)}`, {
    bars: rs,
    partial: typed < rs.length,
    temperature: temperature || undefined,
    resolution: form.elements.meter_resolution.value.trim() || undefined,
  });
  if (seq < bench.shown) return;
  bench.shown = seq;
  for (const l of $$(".reading")) l.classList.remove("fail", "pass", "invalid", "hint"), ($(".judge", l).textContent = "");
  if (status !== 200) {
    showProblems(
      form,
      (json.errors || []).map((e) => ({ ...e, path: "" })),
    );
    for (const e of json.errors || []) {
      const m = /bars\[(\d+)\]$/.exec(e.path);
      if (m) $$(".reading")[Number(m[1])]?.classList.add("invalid");
    }
    document.body.dataset.judged = String(seq);
    return;
  }
  showProblems(form, []);
  bench.last = json;
  const suspects = (json.suspects || []).filter((s) => s.kind !== "level_off_plan" && s.kind !== "readings_inconsistent");
  drawDiagram(suspects.flatMap((s) => s.coils));
  const done = !json.partial;
  $("#verdict").replaceChildren(
    h(
      "p",
      { class: `verdict ${json.ok ? (done ? (suspects.length ? "warn" : "ok") : "sub") : "bad"}`, id: "verdict-line" },
      done
        ? json.ok
          ? suspects.length
            ? "every reading within the bench rules, but a coil stands out:"
            : "every reading within the bench rules"
          : "a reading is out of tolerance"
        : json.ok
          ? `${json.read} of ${json.of} readings: none out so far`
          : `${json.read} of ${json.of} readings: a reading is out already`,
    ),
    suspects.length
      ? h(
          "ul",
          { class: "suspects" },
          suspects.map((s) => h("li", { "data-kind": s.kind }, s.message)),
        )
      : h(
          "p",
          {},
          done
            ? "No coil stands out."
            : json.read >= json.spread_from
              ? "No coil stands out so far."
              : `Coils are judged from ${json.spread_from} readings on.`,
        ),
    ...(json.partial ? json.notes : json.notes || []).map((n) => h("p", { class: "sub" }, n)),
  );
  markReadings(json);
  document.body.dataset.judged = String(seq);
}

/** Each reading as diagnose judged it: alone against the plan (partial sets), against the median of the set (the spread rule). */
function markReadings(d) {
  const labels = $$(".reading");
  (d.readings || []).forEach((r, i) => {
    const l = labels[i];
    if (!l || (d.partial && !r.read)) return;
    const parts = [];
    if (d.partial && r.alone) parts.push(r.alone.deviation_fraction === null ? "open" : `${signed(r.alone.deviation_fraction)} of plan`);
    if (typeof r.of_median_fraction === "number") parts.push(`${signed(r.of_median_fraction)} of median`);
    if (r.pass === false) l.classList.add("fail");
    else if (r.pass === true) l.classList.add("pass");
    else if (r.alone && !r.alone.pass) l.classList.add("hint");
    const word = r.pass === false ? "out" : r.pass === true ? "within" : r.alone && !r.alone.pass ? "off the plan?" : "";
    $(".judge", l).textContent = [word, parts.join(", ")].filter(Boolean).join(": ");
  });
  const level = d.level;
  if (level && typeof level.deviation_fraction === "number") {
    $("#verdict").append(
      h(
        "p",
        { class: level.pass ? "sub" : "bad" },
        `median${d.partial ? " so far" : ""} ${fmt(d.median_ohm, 4)} Ω against ${fmt(level.expected_median_ohm, 4)} Ω expected (${signed(level.deviation_fraction)}, window ±${fmt(level.window_fraction * 100, 2)} %): ${level.pass ? "within" : "out"}`,
      ),
    );
  }
  for (const f of d.failures || []) $("#verdict").append(h("p", { class: "bad" }, f.message ?? JSON.stringify(f)));
}

/** The commutator seen from its end: bars round a ring, each coil an arc from its start bar to its end bar; suspects in red. */
function drawDiagram(suspectCoils) {
  const p = bench.plan;
  if (!p) return;
  const C = bench.bars;
  const S = 440,
    cx = S / 2,
    cy = S / 2,
    R = 120;
  const ang = (bar) => -Math.PI / 2 + ((bar - 1) / C) * 2 * Math.PI;
  const svg = h("svg:svg", { viewBox: `0 0 ${S} ${S}`, class: "diagram", role: "img", "aria-label": "commutator and coils" });
  svg.append(h("svg:circle", { cx, cy, r: R, class: "ring" }));
  for (let b = 1; b <= C; b++) {
    const a = ang(b);
    svg.append(h("svg:circle", { cx: cx + R * Math.cos(a), cy: cy + R * Math.sin(a), r: 5, class: "bar" }));
    if (C <= 40 || b % 2 === 1)
      svg.append(h("svg:text", { x: cx + (R - 18) * Math.cos(a), y: cy + (R - 18) * Math.sin(a) + 4, "text-anchor": "middle", class: "label" }, String(b)));
  }
  const bad = new Set(suspectCoils);
  for (const c of p.coils) {
    if (c.dead) continue;
    const a1 = ang(c.start_bar),
      a2 = ang(c.end_bar);
    const mid = Math.atan2(Math.sin(a1) + Math.sin(a2), Math.cos(a1) + Math.cos(a2));
    const out = R + 28 + (bad.has(c.index) ? 6 : 0);
    const path = `M ${cx + R * Math.cos(a1)} ${cy + R * Math.sin(a1)} Q ${cx + out * 1.25 * Math.cos(mid)} ${cy + out * 1.25 * Math.sin(mid)} ${cx + R * Math.cos(a2)} ${cy + R * Math.sin(a2)}`;
    svg.append(
      h(
        "svg:path",
        { d: path, class: `coil${bad.has(c.index) ? " suspect" : ""}`, "data-coil": c.index },
        h("svg:title", {}, `coil ${c.index}: bars ${c.start_bar}–${c.end_bar}, slots ${c.go_slot}–${c.return_slot}`),
      ),
    );
    // the label just beyond the arc's apex (the curve's midpoint: a quarter of each end, half the control point)
    const apex =
      Math.hypot(
        0.25 * (Math.cos(a1) + Math.cos(a2)) * R + 0.5 * out * 1.25 * Math.cos(mid),
        0.25 * (Math.sin(a1) + Math.sin(a2)) * R + 0.5 * out * 1.25 * Math.sin(mid),
      ) + 18;
    if (bad.has(c.index))
      svg.append(
        h(
          "svg:text",
          { x: cx + apex * Math.cos(mid), y: cy + apex * Math.sin(mid) + 5, "text-anchor": "middle", class: "suspect-label", "data-suspect": c.index },
          `coil ${c.index}`,
        ),
      );
  }
  $("#diagram").replaceChildren(svg);
}

/** One failed check of `log`, in words: what was measured against what was predicted, and the band. */
function failureLine(f) {
  if (f.message) return f.message;
  const unit = f.unit === "ohm" ? "Ω" : (f.unit ?? "");
  return `${f.check.replace(/_/g, " ")}: measured ${fmt(f.measured_20c_value ?? f.measured_value, 4)} ${unit} against ${fmt(f.predicted_value, 4)} ${unit} predicted (${signed(f.deviation_fraction)}, band ±${fmt(f.tolerance_fraction * 100, 2)} %): ${f.verdict}`;
}

async function logRecord(again = false) {
  const form = $("#bench-form");
  const v = (n) => form.elements[n].value.trim();
  const measured = { version: 1, job: data.id, date: v("date"), temperature: v("temperature") || "20 C", bar_to_bar: readings() };
  if (v("meter_resolution")) measured.meter_resolution = v("meter_resolution");
  if (v("terminal_resistance")) measured.terminal_resistance = v("terminal_resistance");
  if (v("nl_supply") || v("nl_current") || v("nl_speed")) measured.no_load = { supply: v("nl_supply"), current: v("nl_current"), speed: v("nl_speed") };
  if (v("notes")) measured.notes = v("notes");
  const { status, json } = await api("POST", `/api/log/${enc(data.file)}${again ? "?again=1" : ""}`, measured);
  const s = $("#log-status");
  const out = $("#log-result");
  out.replaceChildren();
  if (status === 200) {
    s.className = json.ok ? "ok" : "warn";
    s.textContent = `logged as ${json.file}${json.ok ? ": every check passed" : ": a check failed (the record is kept)"}`;
    if (json.failures?.length)
      out.append(
        h(
          "ul",
          { class: "failures" },
          json.failures.map((f) => h("li", { class: "bad" }, failureLine(f))),
        ),
      );
    out.append(h("p", {}, h("a", { href: "/history" }, "the logbook")));
    return;
  }
  s.className = "bad";
  const errors = json.errors || [];
  if (errors.some((e) => e.code === "already_logged")) {
    s.textContent = "not logged: the logbook already holds these readings of this job, for this date";
    out.append(h("button", { type: "button", id: "log-again", class: "add", onclick: () => logRecord(true) }, "Log them again anyway"));
    return;
  }
  s.textContent = "not logged";
  showProblems(
    form,
    errors.map((e) => ({ ...e, path: "" })),
  );
}

// ---------------------------------------------------------------- the logbook

async function initHistory() {
  const sel = $("#family");
  const all = await api("GET", "/api/history");
  const families = [...new Set((all.json.records || []).map((r) => r.family).filter(Boolean))].sort();
  for (const f of families) sel.append(h("option", { value: f, selected: f === data.family }, f));
  sel.addEventListener("change", () => {
    const u = new URL(location.href);
    if (sel.value) u.searchParams.set("family", sel.value);
    else u.searchParams.delete("family");
    history.replaceState(null, "", u);
    data.family = sel.value;
    showHistory();
  });
  showHistory();
}

async function showHistory() {
  const q = data.family ? `?family=${encodeURIComponent(data.family)}` : "";
  const { json } = await api("GET", `/api/history${q}`);
  const recs = json.records || [];
  $("#history-plot").replaceChildren(recs.length ? h("img", { src: `/api/history-svg${q}`, alt: "predicted against measured, record by record" }) : "");
  const head = ["date", "job", "family", "winding", "terminal Ω predicted", "measured", "no-load rpm predicted", "measured", "checks"];
  $("#history").replaceChildren(
    recs.length
      ? h(
          "div",
          { class: "scroll" },
          h(
            "table",
            { class: "records" },
            h(
              "thead",
              {},
              h(
                "tr",
                {},
                head.map((x) => h("th", {}, x)),
              ),
            ),
            h(
              "tbody",
              {},
              recs.map((r) =>
                h(
                  "tr",
                  {},
                  h("td", {}, r.date),
                  h("td", {}, r.job_id),
                  h("td", {}, r.family ?? "—"),
                  h("td", {}, windingLine(r.turns_per_coil, r.wire, r.strands_in_hand)),
                  h("td", {}, fmt(r.terminal_predicted_ohm, 4)),
                  h("td", {}, fmt(r.terminal_measured_ohm, 4)),
                  h("td", {}, fmt(r.no_load_speed_predicted_rpm)),
                  h("td", {}, fmt(r.no_load_speed_measured_rpm)),
                  h("td", { class: r.checks_ok ? "ok" : "bad" }, r.checks_ok ? "passed" : `failed: ${r.checks_failed.join(", ")}`),
                ),
              ),
            ),
          ),
        )
      : h("p", {}, "No records in the logbook yet."),
  );
}

// ---------------------------------------------------------------- the job list

/** Each job's last plan verdict, from `check --json`, one job after another. */
async function initList() {
  for (const cell of $$("[data-check]")) {
    const { status, json } = await api("GET", `/api/check/${enc(cell.dataset.check)}`);
    const w = (json.warnings || []).length;
    const [cls, text] =
      status === 200
        ? json.feasible
          ? ["ok", "a winding meets the goal"]
          : ["warn", "no winding meets the goal"]
        : ["bad", (json.errors || []).map((e) => `${e.message} [${e.code}]`)[0] || "cannot be planned"];
    cell.replaceChildren(
      h("span", { class: `badge ${cls}` }, status === 200 ? text : "invalid"),
      w ? h("span", { class: "sub" }, ` ${w} warning${w > 1 ? "s" : ""}`) : "",
      status === 200 ? "" : h("div", { class: "sub" }, text),
    );
    cell.dataset.verdict = status === 200 ? (json.feasible ? "feasible" : "infeasible") : "invalid";
  }
}

// ---------------------------------------------------------------- the card

/** The card in its frame: print it, change the paper (the frame, the download and the tab follow). */
function initCard() {
  const frame = $("#card");
  const base = `/api/card/${enc(data.file)}`;
  const status = $("#card-status");
  frame.addEventListener("load", () => (status.textContent = ""));
  $("#paper").addEventListener("change", (ev) => {
    const q = ev.target.value ? `?paper=${ev.target.value}` : "";
    status.textContent = "making the card…";
    frame.src = base + q;
    $("#open").href = base + q;
    $("#download").href = `${base}${q ? `${q}&` : "?"}download=1`;
  });
  $("#print").addEventListener("click", () => {
    try {
      frame.contentWindow.focus();
      frame.contentWindow.print();
    } catch {
      window.open($("#open").href, "_blank", "noopener");
    }
  });
}

// ---------------------------------------------------------------- a new job

function initNew() {
  const form = $("#new-form");
  form.addEventListener("submit", async (ev) => {
    ev.preventDefault();
    const id = form.elements.id.value.trim();
    const { status, json } = await api("POST", "/api/new", { style: form.elements.style.value, id });
    if (status === 200) location.href = `/job/jobs/${encodeURIComponent(id)}.yaml`;
    else $("#new-status").textContent = (json.errors || []).map((e) => `${e.message} [${e.code}]`).join("; ");
  });
}

const init = { list: initList, job: initJob, bench: initBench, card: initCard, history: initHistory, new: initNew }[document.body.dataset.page];
if (init) init();
