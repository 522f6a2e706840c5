/**
 * A job in, a plan out: the armature, the calibrated original, the sweep, and the chosen winding,
 * the candidates shown and the original evaluated in full (src/design/evaluate.ts). Pure: no files,
 * no terminal.
 */
import type { Warning } from "../errors.js";
import type { Job } from "../job/schema.js";
import { COPPER_DENSITY, copperFactor } from "../wire/copper.js";
import { fieldCurrent } from "../motor/model.js";
import { defaultStock, resolveWire } from "../wire/catalogue.js";
import type { Wire } from "../wire/types.js";
import { buildContext, supplyOf, type ArmatureContext } from "./context.js";
import { calibrateOriginal, type LogbookCalibration } from "./calibration.js";
import { makeEvaluator, type Evaluator, type FullEvaluation } from "./evaluate.js";
import { sweep, type SweepResult } from "./sweep.js";
import { ELV_AC, ELV_DC, seriesPlanOf, type SeriesPlan } from "./series.js";
import { inputError } from "../errors.js";
import { toleranceText } from "../format/goal.js";
import type { Calibration, Candidate, CoilPlan, GoalKind, GoalReport, Plan, RejectCode, ResistancePlan, Sensitivity, WirePlan } from "./types.js";

export { ELV_AC, ELV_DC };

export interface PlanOptions {
  /** What the logbook of the same family contributes (the CLI reads it; the core only uses it). */
  logbook?: LogbookCalibration & { mltFactor?: number; moves?: { figure: string; from: number; to: number; unit: string }[] };
}

const REASON_TEXT: Record<RejectCode, string> = {
  copper_fill: "copper fill above the limit",
  space_fill: "the wires' overall circles fill more of the slot than round wire packs",
  layer_build: "the layers build deeper than the slot allows where it narrows",
  slot_opening: "the wire (with its strands side by side) does not pass the slot opening with clearance",
  overall_unknown: "no overall diameter is known for this wire: measure one",
  current_density: "current density in each strand above the limit",
  hot_stall_current: "hot stall current above the limit",
  below_original_copper: "less than 97 % of the original's copper area",
};

export function reasonText(code: RejectCode): string {
  return REASON_TEXT[code];
}

export { supplyOf };

export function stockWires(job: Job): { wires: Wire[]; warnings: Warning[] } {
  const warnings: Warning[] = [];
  if (!job.wire_stock) return { wires: defaultStock(), warnings };
  const wires = job.wire_stock.map((spec, i) => {
    const w = resolveWire(spec);
    if (spec.assumed) warnings.push({ code: "wire_assumed", path: `wire_stock[${i}]`, message: spec.assumed });
    if (w.overall_diameter === null) {
      warnings.push({
        code: "overall_unknown",
        path: `wire_stock[${i}]`,
        message: `${w.label}: no overall diameter is known for this size and insulation; measure one and write { bare: …, overall: … }`,
      });
    }
    return w;
  });
  return { wires, warnings };
}

function goalReport(ev: Evaluator, c: Candidate, tolerance: Job["target"]["tolerance"]): GoalReport {
  return {
    kind: ev.goal,
    target: ev.target,
    achieved: c.achieved,
    error_fraction: c.error,
    tolerance,
    fixed: ev.goal === "fixed" ? { turns: c.turns, wire: c.wire.label, strands: c.strands } : null,
  };
}

/** The sweep over the stock (restore and fixed: the given turns only). */
function runSweep(ev: Evaluator, ctx: ArmatureContext, wires: Wire[]) {
  const job = ctx.job;
  return sweep(ev, {
    wires,
    maxInHand: job.max_in_hand,
    fixedTurns: ev.goal === "restore" ? job.original.turns : ev.goal === "fixed" ? job.target.fixed!.turns : undefined,
    fixedStrands: ev.goal === "fixed" ? job.target.fixed!.strands : undefined,
    sides: ctx.sides,
    freeArea: ctx.slot.free_area,
  });
}

/** What binds when the chosen winding misses the goal: its own rejections, else the limit that rejects most. */
function bindingOf(ev: Evaluator, chosen: Candidate, result: SweepResult, job: Job): string {
  const reasons = chosen.rejected_because.map(reasonText);
  if (reasons.length) return `the closest candidate is held back by: ${reasons.join("; ")}`;
  const top = Object.entries(result.rejections).sort((a, b) => b[1] - a[1])[0];
  return `no candidate within the limits comes within ${toleranceText(ev.goal, job.target.tolerance)} of the goal${top ? `; the limit that rejects most candidates: ${reasonText(top[0] as RejectCode)} (${top[1]} of ${result.total})` : ""}`;
}

/** Warnings the motor figures raise: the series field, the model's own, a duty beyond stall (new and original). */
function motorWarnings(job: Job, supply: number, chosen: FullEvaluation, original: FullEvaluation, fieldDescribed: boolean, warnings: Warning[]): void {
  const series = job.armature.field === "series";
  if (series && !warnings.some((w) => w.code === "series_field")) {
    warnings.push({
      code: "series_field",
      path: fieldDescribed ? "armature.field" : "field_winding",
      message: fieldDescribed
        ? "series (universal) motor: its figures are the series model's (motor.series), not the constant-field ones; locked-rotor figures only at a reduced voltage, never at mains; never run a large series motor unloaded"
        : "series (universal) motor: only what the armature alone determines is predicted (resistance, Ke scaled by turns); give field_winding (the field's resistance, and its inductance or a locked-rotor reading on AC) with a no-load test or the nameplate for the motor's figures; never run a series motor unloaded, it races",
    });
  }
  for (const w of chosen.motor.warnings) if (!warnings.some((x) => x.code === w.code)) warnings.push(w);
  if (!job.target.duty) return;
  for (const [which, e] of [
    ["new", chosen],
    ["original", original],
  ] as const) {
    // a calibrated motor (constant field, or a series field with k) that cannot carry the load
    if (e.duty === null && (e.motor.model || (e.motor.series?.k ?? null) !== null)) {
      const beyond = series
        ? "beyond its locked-rotor torque"
        : `beyond its stall torque${e.motor.stallTorque !== null ? ` (${(e.motor.stallTorque * 1e3).toPrecision(3)} mN·m)` : ""}`;
      warnings.push({
        code: "duty_beyond_stall",
        path: "target.duty.torque",
        message: `the ${which} winding cannot carry the ${(job.target.duty.torque * 1e3).toPrecision(3)} mN·m load at ${supply} V: it is ${beyond}`,
      });
    }
  }
}

/** Warnings on the original's fill: above the limit (a restore allows it), or more than hand winding reaches. */
function originalFillWarnings(ctx: ArmatureContext, goal: GoalKind, warnings: Warning[]): void {
  const job = ctx.job;
  if (goal === "restore" && ctx.original.copperFill > job.target.limits.copper_fill) {
    warnings.push({
      code: "original_over_limit",
      path: "target.limits.copper_fill",
      message: `the original winding filled ${(ctx.original.copperFill * 100).toFixed(1)} % of the slot with copper, above the ${(job.target.limits.copper_fill * 100).toFixed(0)} % limit; since it fitted, the restore allows up to its own fill`,
    });
  }
  if (ctx.original.copperFill > 0.65) {
    warnings.push({
      code: "original_fill_unusual",
      path: "original",
      message: `the recorded original would fill ${(ctx.original.copperFill * 100).toFixed(0)} % of the free slot area with copper, more than hand winding reaches: check the turns, the wire and the slot size`,
    });
  }
}

/** Sensitivity: one turn less and more, the next wire down and up in the stock, each fully evaluated (goal figure SI). */
function sensitivityRows(ev: Evaluator, chosen: Candidate, wires: Wire[]): Sensitivity[] {
  const sorted = [...wires].sort((a, b) => a.bare_diameter - b.bare_diameter);
  const idx = sorted.findIndex((w) => w.label === chosen.wire.label);
  const row = (label: string, turns: number, wire: Wire): Sensitivity => {
    const c = ev.full({ turns, wire, strands: chosen.strands });
    return {
      label,
      turns: c.turns,
      wire: c.wire.label,
      strands: c.strands,
      terminal_ohm: c.terminal_ohm,
      copper_fill: c.copper_fill,
      achieved: c.achieved,
      meets_goal: c.meets_goal,
      rejected_because: c.rejected_because,
    };
  };
  const rows: Sensitivity[] = [];
  if (chosen.turns > 1) rows.push(row("one turn less", chosen.turns - 1, chosen.wire));
  rows.push(row("one turn more", chosen.turns + 1, chosen.wire));
  if (idx > 0) rows.push(row("next wire down", chosen.turns, sorted[idx - 1]));
  if (idx >= 0 && idx < sorted.length - 1) rows.push(row("next wire up", chosen.turns, sorted[idx + 1]));
  return rows;
}

/**
 * The cut list (m, kg): one coil N·k·MLT, the winding over every coil wound (a wave winding's dead
 * coil is wound and cut like the others), two leads per coil and strand, and the spare margin on
 * everything: cut = (winding + leads)·(1 + margin); copper mass ρ_Cu·A·cut (IEC 60028 density).
 */
function wirePlan(ctx: ArmatureContext, chosen: Candidate): WirePlan {
  const w = ctx.job.winding;
  const perCoil = chosen.turns * chosen.strands * chosen.mlt;
  const windingLen = perCoil * ctx.woundCoils;
  const leads = 2 * w.lead_allowance * ctx.woundCoils * chosen.strands;
  const cut = (windingLen + leads) * (1 + w.spare_margin);
  return {
    mlt: chosen.mlt,
    mlt_source: ctx.mltSource,
    per_coil: perCoil,
    winding: windingLen,
    leads,
    cut,
    cut_per_strand: cut / chosen.strands,
    copper_mass: COPPER_DENSITY * chosen.wire.area * cut,
    spare_margin: w.spare_margin,
    lead_allowance: w.lead_allowance,
  };
}

/** The resistance section of the plan from the chosen winding's full evaluation. */
function resistancePlan(job: Job, chosen: FullEvaluation): ResistancePlan {
  const r = chosen.ring;
  const validity: string[] = [];
  if (job.winding.equalizers)
    validity.push(
      "equalizer connections are fitted: they tie bars together, so the bar-to-bar and terminal figures from the plain ring do not hold; the figures here include the equalizers as near-zero links",
    );
  return {
    coil_ohm: chosen.coil_ohm,
    bar_to_bar: r.bar_to_bar,
    bar_to_bar_ohm: r.bar_to_bar.reduce((s: number, x: number) => s + x, 0) / r.bar_to_bar.length,
    terminal_ohm: r.single,
    terminal_min_ohm: r.min,
    terminal_max_ohm: r.max,
    terminal_hot_ohm: chosen.terminal_hot_ohm,
    hot_temperature: job.target.hot_temperature,
    validity,
    terminal_basis: r.basis,
  };
}

/**
 * The armature, its calibration (a series motor's field model included) and the evaluator for a
 * job (the logbook's correction applied when the armature is built). Goal convert needs the
 * original's rated point (src/design/series.ts).
 */
export function preparePlan(job: Job, options: PlanOptions = {}) {
  const ctx = buildContext(job, { mltFactor: options.logbook?.mltFactor });
  const { calibration, warnings } = calibrateOriginal(ctx, options.logbook);
  const ev = makeEvaluator(ctx, calibration);
  if (job.target.goal === "convert" && (ev.physics.series?.convertRatio ?? null) === null) {
    throw inputError(
      "goal_uncalibrated",
      "original.nameplate",
      "goal convert needs the original's rated point: field_winding (resistance, and inductance on AC) with a nameplate or load test that leaves the motor a load torque",
    );
  }
  return { ctx, calibration, calibrationWarnings: warnings, ev };
}

/** The series model's section of the plan from the two full evaluations (null unless a series motor's field is described). */
function seriesOf(job: Job, ev: Evaluator, chosen: FullEvaluation, original: FullEvaluation, warnings: Warning[]): SeriesPlan | null {
  const figures = ev.physics.series;
  if (!figures || !chosen.motor.series || !original.motor.series) return null;
  warnings.push(...original.motor.warnings);
  return seriesPlanOf(job, figures, original.motor.series, chosen.motor.series, chosen.turns, original.turns);
}

/**
 * A job in, a plan out (SI): the armature, the calibration, the sweep (cheap evaluations), then the
 * chosen winding, the listed candidates, the sensitivity rows and the original winding evaluated
 * in full. Nothing is changed after it is made.
 */
export function planJob(job: Job, options: PlanOptions = {}): Plan {
  const { ctx, calibration: cal, calibrationWarnings, ev } = preparePlan(job, options);
  const warnings: Warning[] = [...ctx.warnings];
  if (job.original.wire.assumed) warnings.push({ code: "wire_assumed", path: "original.wire", message: job.original.wire.assumed });
  warnings.push(...calibrationWarnings);
  const { volts: supply, kind: supplyKind } = supplyOf(job);
  const stock = fixedOrStock(job);
  warnings.push(...stock.warnings);
  if (ev.goal !== "restore" && !ev.physics.canPredict(cal.ke)) {
    warnings.push({
      code: "goal_uncalibrated",
      path: "target.goal",
      message: `the ${ev.goal.replace(/_/g, " ")} cannot be predicted without a calibrated Ke; the plan falls back to the most copper that fits`,
    });
  }
  const result = runSweep(ev, ctx, stock.wires);
  if (!result.best) throw new Error("empty sweep"); // no wire in stock at all (cannot happen with a non-empty stock)
  const chosen = ev.full(result.best);
  const candidates = result.shown.map((c) => (c === result.best ? chosen : c)); // cheap figures equal the full ones (test/evaluate-properties.test.ts)
  const binding = chosen.meets_goal ? null : bindingOf(ev, chosen, result, job);
  if (binding) warnings.push({ code: "goal_not_met", path: "target.goal", message: `no winding meets the goal within the limits: ${binding}` });
  const o = ctx.original;
  const original = ev.full({ turns: o.turns, wire: o.wire, strands: o.strands }, { measuredTerminal20: o.terminal20, original: true });
  const series = seriesOf(job, ev, chosen, original, warnings);
  motorWarnings(job, supply, chosen, original, cal.series !== null, warnings);
  originalFillWarnings(ctx, ev.goal, warnings);
  warnings.push(...limitWarnings(ev, chosen));
  warnings.push(...oneTestWarnings(job, chosen, supply), ...shuntWarnings(job, cal, supply));
  const coils: CoilPlan[] = ctx.layout.coils.map((c, i) => ({ ...c, turns: chosen.turns, mlt: chosen.coil_mlt[i], ohm: chosen.coil_ohms[i] }));
  return {
    job,
    feasible: chosen.meets_goal,
    goal: goalReport(ev, chosen, job.target.tolerance),
    layout: ctx.layout,
    slot: ctx.slot,
    design: chosen,
    fill_limit: ev.fillLimit,
    coils,
    paths: ctx.layout.paths,
    resistance: resistancePlan(job, chosen),
    wire: wirePlan(ctx, chosen),
    calibration: cal,
    series,
    motor: chosen.motor,
    original_motor: original.motor,
    original: {
      wire: o.wire,
      turns: o.turns,
      strands: o.strands,
      copper_fill: o.copperFill,
      mlt: o.mlt,
      terminal_ohm: o.terminal20,
      terminal_measured: o.terminalMeasured,
      overall: o.overall,
      overall_basis: o.overallBasis,
    },
    duty: chosen.duty,
    original_duty: original.duty,
    candidates,
    candidates_total: result.total,
    rejections: result.rejections,
    binding,
    sensitivity: sensitivityRows(ev, chosen, stock.wires),
    supply,
    supply_kind: supplyKind,
    mains: supplyKind === "ac" ? supply > ELV_AC : supply > ELV_DC,
    warnings: dedupeWarnings(warnings),
    learning: options.logbook ? { records: options.logbook.records, moves: options.logbook.moves ?? [] } : null,
  };
}

/** Goal `fixed`: the chosen wire alone (its build or grade said when assumed); else the stock. */
function fixedOrStock(job: Job): { wires: Wire[]; warnings: Warning[] } {
  const f = job.target.fixed;
  if (job.target.goal !== "fixed" || !f) return stockWires(job);
  const warnings: Warning[] = [];
  if (f.wire.assumed) warnings.push({ code: "wire_assumed", path: "target.fixed.wire", message: f.wire.assumed });
  return { wires: [resolveWire(f.wire)], warnings };
}

/** What to re-measure when a check disagrees with a winding that fitted. */
const REMEASURE: Partial<Record<RejectCode, { path: string; what: string }>> = {
  space_fill: { path: "armature.slot", what: "the slot's area (or its widths and depth), the liner and the old wire's overall diameter" },
  layer_build: { path: "armature.slot", what: "the slot's depth and its widths at the top and at the root, and the liner" },
};

/**
 * Warnings for the limits in force: the current-density default; the limits a `fixed` winding
 * breaks (planned anyway); the checks a `restore`'s original itself fails (planned anyway, naming
 * the geometry to re-measure). docs/contracts.md "Choosing among candidates".
 */
function limitWarnings(ev: Evaluator, chosen: Candidate): Warning[] {
  const out: Warning[] = [];
  const d = ev.density;
  if (d.basis === "default" || d.basis === "original") {
    out.push({
      code: "current_density_default",
      path: "target.limits.current_density",
      message:
        d.basis === "default"
          ? `no current_density limit given: ${d.limit! / 1e6} A/mm² in each strand applies (common practice for small fan-cooled motors, no published source); write current_density: none to turn it off`
          : `no current_density limit given: the original winding's own ${(d.limit! / 1e6).toPrecision(3)} A/mm² at that point applies (above the usual 10 A/mm², and it survived); write current_density: none to turn it off`,
    });
  }
  if (ev.goal === "fixed") {
    for (const r of chosen.rejected_because) {
      out.push({
        code: "limit_broken",
        path: `target.limits.${r === "below_original_copper" ? "copper_fill" : r}`,
        message: `the winding chosen breaks a limit: ${reasonText(r)}; it is planned as given`,
      });
    }
  }
  if (ev.goal === "restore") out.push(...restoreGeometryWarnings(ev, chosen));
  return out;
}

/**
 * A restore is wound at the original's turns, which fitted: where the space-fill or layer check
 * says the chosen winding (or the original itself) does not fit the slot, the slot's recorded
 * geometry or the old wire's assumed overall diameter is what is wrong. Warn, naming what to re-measure.
 */
function restoreGeometryWarnings(ev: Evaluator, chosen: Candidate): Warning[] {
  const out: Warning[] = [];
  const o = ev.originalFails;
  const spaceFails = chosen.space_fill !== null && chosen.space_fill > ev.spaceLimit + 1e-12;
  if (spaceFails || o.space_fill !== null) {
    const sf = Math.max(chosen.space_fill ?? 0, o.space_fill ?? 0);
    const m = REMEASURE.space_fill!;
    out.push({
      code: "original_disagrees",
      path: m.path,
      message: `the wires' overall circles would fill ${(sf * 100).toFixed(1)} % of the free slot area, above the ${(ev.spaceLimit * 100).toFixed(0)} % limit, yet the original was wound at these turns: the restore is planned; re-measure ${m.what}`,
    });
  }
  const layerFails = chosen.build !== null && !chosen.build.fits;
  if (layerFails || o.layer_build) {
    const m = REMEASURE.layer_build!;
    out.push({
      code: "original_disagrees",
      path: m.path,
      message: `the layer model says ${layerFails ? `${chosen.turns} turns of ${chosen.wire.label}` : "the original's turns"} do not fit the slot${o.layer_build ? ", nor did the original's" : ""}, yet the original was wound at these turns: the restore is planned; re-measure ${m.what}`,
    });
  }
  return out;
}

/**
 * A shunt motor: what its field takes and where the figures include it (the field sits across the
 * supply: I_f = V/R_f, its copper loss V·I_f = V²/R_f; docs "Steady state" and "Calibration of Ke",
 * less a shunt field's current). The field's current comes from the motor model (src/motor/model.ts
 * `fieldCurrent`), cold (20 °C) and hot as the armature (`hot_temperature`).
 */
function shuntWarnings(job: Job, cal: Calibration, supply: number): Warning[] {
  if (job.armature.field !== "shunt") return [];
  const r = cal.shunt_field_ohm;
  if (r === null) {
    return [
      {
        code: "shunt_field",
        path: "field_winding",
        message:
          "shunt field of unknown resistance: Ke is fitted on the whole no-load current, the field's current counts as the armature's loss current, and the input and efficiencies hold its loss only that way; give field_winding.resistance or each test's field_current",
      },
    ];
  }
  const cold = fieldCurrent(r, supply);
  const hot = fieldCurrent(r * copperFactor(job.target.hot_temperature), supply);
  const p = (x: number) => x.toPrecision(3);
  return [
    {
      code: "shunt_field",
      path: "armature.field",
      message:
        `shunt field ${r.toPrecision(4)} Ω at 20 °C takes ${p(cold)} A at ${supply} V (${p(hot)} A hot): taken off each no-load test before Ke is fitted; ` +
        `the predicted no-load current, the input power and every efficiency include it (its copper loss ${p(supply * cold)} W cold, ${p(supply * hot)} W hot); ` +
        `stall and duty currents are the armature's, and the meter at the terminals reads the field's current besides`,
    },
  ];
}

/** How far the new no-load speed may lie from the only no-load test before the held-constant loss torque is called rough: ×0.7 … ×1.4 (armwind's own choice, common practice, no published source). */
export const ONE_TEST_SPAN = { below: 0.7, above: 1.4 };

/**
 * With one no-load test the loss torque is held constant (T_c alone): at a no-load speed far from
 * that test's, the predicted idle current is rough (a rewind that runs at half the speed idles on
 * less than the test's loss torque, as friction and iron loss fall with speed). Warn, and ask for a
 * second test at about half the supply (docs "Calibration of Ke").
 */
function oneTestWarnings(job: Job, chosen: FullEvaluation, supply: number): Warning[] {
  const tests = (job.original.tests ?? []).filter((t) => (t as { kind?: string }).kind !== "load");
  const w = chosen.motor.noLoadSpeed;
  if (tests.length !== 1 || job.armature.field === "series" || w === null || !(w > 0)) return [];
  const speed = tests[0].no_load_speed;
  if (speed === undefined) return [];
  const ratio = w / speed;
  if (ratio >= ONE_TEST_SPAN.below && ratio <= ONE_TEST_SPAN.above) return [];
  const rpm = (x: number) => ((x * 60) / (2 * Math.PI)).toFixed(0);
  return [
    {
      code: "loss_from_one_test",
      path: "original.tests",
      message: `the loss torque comes from one no-load test at ${rpm(speed)} rpm and is held constant, but the new winding idles at ${rpm(w)} rpm (×${ratio.toFixed(2)}): its no-load current is rough (${ratio < 1 ? "likely high" : "likely low"}); a second no-load test of the old motor at about half the supply (${(supply / 2).toPrecision(3)} V) fits the part that changes with speed`,
    },
  ];
}

function dedupeWarnings(ws: Warning[]): Warning[] {
  const seen = new Set<string>();
  return ws.filter((w) => {
    const k = `${w.code}|${w.path}|${w.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
