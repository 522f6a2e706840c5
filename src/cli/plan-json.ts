/**
 * The `plan --json` output: docs/contracts.md's contract. Keys snake_case, units as the last part of each
 * key, numbers unrounded, unknowable figures null (never absent).
 */
import type { Candidate, MotorReport, Plan } from "../design/types.js";
import type { GoalKind } from "../design/types.js";
import { supplyOf } from "../design/plan.js";
import type { SeriesFigure } from "../design/series.js";
import { goalSummary } from "../format/goal.js";
import { GOAL_UNIT, convert, goalValue, toAPerMm2, toGrams, toMm, toMm2, toRpm } from "../format/units.js";
import { kvFromKe } from "../motor/emf.js";

const n = (x: number | null | undefined): number | null => convert(x, (v) => v);
const mm = (m: number | null | undefined) => convert(m, toMm);
const rpm = (w: number | null | undefined) => convert(w, toRpm);
const density = (j: number | null | undefined) => convert(j, toAPerMm2);

export function wireJson(w: Candidate["wire"]) {
  return {
    label: w.label,
    bare_diameter_mm: toMm(w.bare_diameter),
    overall_diameter_mm: mm(w.overall_diameter),
    source: w.overall_source,
    system: w.system,
    insulation: w.insulation,
    area_mm2: toMm2(w.area),
    ohm_per_m: w.ohm_per_m,
  };
}

function seriesPointJson(p: SeriesFigure | null) {
  return {
    current_a: p ? p.current : null,
    speed_rpm: p ? toRpm(p.speed) : null,
    torque_n_m: p ? p.torque : null,
    efficiency: p ? p.efficiency : null,
    input_w: p ? p.inputW : null,
    output_w: p ? p.outputW : null,
    power_factor: p ? p.powerFactor : null,
  };
}

/** docs/contracts.md's `motor.series` for one side (original or new), null members where the job lacks the data. */
function seriesJson(plan: Plan, which: "original" | "rewound") {
  const sp = plan.series;
  if (!sp) {
    // a series motor whose field the job does not describe: the contract's keys, each unknown
    const none = { supply_v: null, frequency_hz: null, current_a: null };
    return { k_v_s_per_a_rad: null, supply_v: plan.supply, frequency_hz: null, field_ohm: null, rated: seriesPointJson(null), locked_rotor: none, curve: [] };
  }
  const side = sp[which];
  const supply = which === "original" ? sp.originalSupply : sp.supply;
  return {
    k_v_s_per_a_rad: side.k,
    supply_v: supply.volts,
    frequency_hz: supply.frequency,
    field_ohm: side.fieldOhm,
    rated: seriesPointJson(side.rated),
    locked_rotor: {
      supply_v: sp.lockedRotor ? sp.lockedRotor.supply.volts : null,
      frequency_hz: sp.lockedRotor ? sp.lockedRotor.supply.frequency : null,
      current_a: side.lockedRotorCurrent,
    },
    curve: side.curve.map((p) => ({ torque_n_m: p.torque, speed_rpm: toRpm(p.speed), current_a: p.current, efficiency: p.efficiency })),
  };
}

/** What the series model adds beside the two motors: where the rated torque and check voltage come from, conversion, no-load run. */
function seriesExtraJson(plan: Plan) {
  const sp = plan.series;
  if (!sp) return null;
  return {
    rated_torque_n_m: sp.ratedTorque,
    rated_source: sp.ratedSource,
    locked_rotor_basis: sp.lockedRotor ? sp.lockedRotor.basis : null,
    no_load: sp.noLoad ? { supply_v: sp.supply.volts, current_a: sp.noLoad.current, speed_rpm: toRpm(sp.noLoad.speed) } : null,
    convert: sp.convert
      ? {
          turns_ratio: sp.convert.ratio,
          turns_per_coil: sp.convert.turns,
          field_turns_per_pole: sp.convert.fieldTurnsPerPole,
          field_ohm: sp.convert.fieldOhm,
          field_area_fraction: sp.convert.fieldAreaFactor,
        }
      : null,
    basis: sp.basis,
  };
}

function motorJson(m: MotorReport, calibration: string, series: ReturnType<typeof seriesJson> | undefined) {
  return {
    ke_v_s_per_rad: n(m.ke),
    kt_n_m_per_a: n(m.kt),
    // both senses of Kv (docs "Kv"): the constant 60/(2π·Ke), and the predicted no-load speed ÷ supply; neither for a series motor
    kv_rpm_per_v: series === undefined && m.noLoadPerVolt !== null ? n(m.kv) : null,
    no_load_rpm_per_v: series === undefined ? rpm(m.noLoadPerVolt) : null,
    terminal_hot_ohm: n(m.resistance),
    no_load_speed_rpm: rpm(m.noLoadSpeed),
    no_load_current_a: n(m.noLoadCurrent),
    stall_current_a: n(m.stallCurrent),
    stall_current_cold_a: n(m.stallCurrentCold),
    stall_torque_n_m: n(m.stallTorque),
    peak_efficiency: n(m.peakEfficiency),
    peak_efficiency_current_a: n(m.peakEfficiencyCurrent),
    max_output_w: n(m.maxOutputW),
    calibration,
    series: series ?? null,
  };
}

function candidateJson(c: Candidate, goal: GoalKind, series: boolean) {
  return {
    turns_per_coil: c.turns,
    wire: c.wire.label,
    strands_in_hand: c.strands,
    copper_fill: c.copper_fill,
    space_fill: n(c.space_fill),
    terminal_ohm: c.terminal_ohm,
    kv_rpm_per_v: c.ke === null || series ? null : kvFromKe(c.ke),
    achieved_value: goalValue(goal, c.achieved),
    error_fraction: n(c.error),
    stall_current_hot_a: n(c.stall_current_hot),
    current_density_a_per_mm2: density(c.current_density),
    copper_mass_g: toGrams(c.copper_mass),
    meets_goal: c.meets_goal,
    rejected_because: c.rejected_because,
  };
}

/** `goal`: the goal's figures in `goal.unit` (src/format/units.ts), its tolerance as given and in words. */
function goalJson(plan: Plan) {
  const g = plan.goal;
  return {
    kind: g.kind,
    unit: GOAL_UNIT[g.kind],
    target_value: goalValue(g.kind, g.target),
    achieved_value: goalValue(g.kind, g.achieved),
    error_fraction: n(g.error_fraction),
    tolerance: g.tolerance.below === g.tolerance.above ? g.tolerance.below : { below_fraction: g.tolerance.below, above_fraction: g.tolerance.above },
    tolerance_below_fraction: g.tolerance.below,
    tolerance_above_fraction: g.tolerance.above,
    summary: goalSummary(g),
  };
}

/** `design`: the chosen winding, its fills, layer build (mm) and current density (A/mm²). */
function designJson(plan: Plan) {
  const d = plan.design;
  return {
    turns_per_coil: d.turns,
    strands_in_hand: d.strands,
    wire: wireJson(d.wire),
    copper_fill: d.copper_fill,
    copper_fill_limit: plan.fill_limit,
    space_fill: n(d.space_fill),
    layers: d.build ? d.build.layers : null,
    turns_per_layer: d.build ? d.build.turnsPerLayer : null,
    build_mm: d.build ? mm(d.build.build) : null,
    build_room_mm: d.build ? mm(d.build.room) : null,
    current_density_a_per_mm2: density(d.current_density),
  };
}

/** `winding` (the layout's pitches and notes) and `slot` (areas mm², opening mm). */
function layoutJson(plan: Plan) {
  const l = plan.layout;
  return {
    winding: {
      style: l.spec.style,
      slots: l.spec.slots,
      bars: l.bars,
      poles: l.spec.poles,
      span: l.spec.span,
      coils_per_slot: l.spec.coils_per_slot,
      progression: l.spec.progression,
      lead_throw: l.spec.lead_throw,
      commutator_pitch: l.commutator_pitch,
      back_pitch: l.back_pitch,
      front_pitch: l.front_pitch,
      coil_sides_per_slot: l.coil_sides_per_slot,
      equalizer_groups: l.equalizer_groups,
      notes: l.notes,
    },
    slot: {
      free_area_mm2: toMm2(plan.slot.free_area),
      gross_area_mm2: toMm2(plan.slot.gross_area),
      liner_area_mm2: toMm2(plan.slot.liner_area),
      opening_mm: toMm(plan.slot.opening),
    },
  };
}

/** `coils`: the coil table, each coil's turn length (mm) and resistance (Ω at 20 °C; null for a dead coil). */
function coilsJson(plan: Plan) {
  return plan.coils.map((c) => ({
    index: c.index,
    go_slot: c.go_slot,
    return_slot: c.return_slot,
    layer: c.go_layer,
    return_layer: c.return_layer,
    start_bar: c.start_bar,
    end_bar: c.end_bar,
    turns: c.turns,
    direction: c.direction,
    mean_turn_length_mm: toMm(c.mlt),
    resistance_ohm: c.dead ? null : c.ohm,
    dead: c.dead,
  }));
}

/** `resistance` (Ω, 20 °C unless hot) and `wire` (the cut list: m, g). */
function readingsAndCutJson(plan: Plan) {
  const r = plan.resistance;
  const w = plan.wire;
  return {
    resistance: {
      coil_ohm: r.coil_ohm,
      bar_to_bar_ohm: r.bar_to_bar_ohm,
      bar_to_bar_each_ohm: r.bar_to_bar,
      terminal_ohm: r.terminal_ohm,
      terminal_min_ohm: r.terminal_min_ohm,
      terminal_max_ohm: r.terminal_max_ohm,
      terminal_hot_ohm: r.terminal_hot_ohm,
      hot_temperature_c: r.hot_temperature,
      validity: r.validity,
      terminal_basis: r.terminal_basis,
    },
    wire: {
      mean_turn_length_mm: toMm(w.mlt),
      mean_turn_length_source: w.mlt_source,
      per_coil_m: w.per_coil,
      winding_m: w.winding,
      leads_m: w.leads,
      cut_m: w.cut,
      cut_per_strand_m: w.cut_per_strand,
      copper_mass_g: toGrams(w.copper_mass),
      spare_margin: w.spare_margin,
    },
  };
}

/** `original` (the recorded winding, and the overall diameter its build was laid at) and `calibration`. */
function originalJson(plan: Plan) {
  const o = plan.original;
  const c = plan.calibration;
  return {
    original: {
      turns_per_coil: o.turns,
      strands_in_hand: o.strands,
      wire: wireJson(o.wire),
      copper_fill: o.copper_fill,
      mean_turn_length_mm: toMm(o.mlt),
      terminal_ohm: o.terminal_ohm,
      terminal_measured: o.terminal_measured,
      laid_overall_diameter_mm: mm(o.overall),
      overall_basis: o.overall_basis,
    },
    calibration: {
      source: c.source,
      ke_v_s_per_rad: n(c.ke),
      uncertainty_fraction: n(c.uncertainty),
      basis: c.basis,
      loss_torque_n_m: c.loss.tc,
      loss_viscous_n_m_s_per_rad: c.loss.b,
      loss_basis: c.loss_basis,
      generator_no_load_disagreement_fraction: n(c.disagreement),
      brush_drop_v: c.brush_drop,
      brush_drop_basis: c.brush_drop_basis,
    },
  };
}

/** `duty`: the chosen winding at the load torque (speeds rpm, density A/mm²), null without a duty. */
function dutyJson(plan: Plan) {
  const d = plan.duty;
  if (!d) return null;
  return {
    torque_n_m: d.torque,
    target_speed_rpm: rpm(d.target_speed),
    current_a: n(d.current),
    terminal_current_a: n(d.terminal_current),
    speed_rpm: rpm(d.speed),
    efficiency: n(d.efficiency),
    input_w: n(d.input_w),
    output_w: n(d.output_w),
    current_density_a_per_mm2: density(d.current_density),
  };
}

/** `candidates`, `sensitivity` (goal figures in `goal.unit`) and what the sweep rejected. */
function sweepJson(plan: Plan, series: boolean) {
  const kind = plan.goal.kind;
  return {
    candidates: plan.candidates.map((c) => candidateJson(c, kind, series)),
    candidates_total: plan.candidates_total,
    rejections: plan.rejections,
    binding: plan.binding,
    sensitivity: plan.sensitivity.map((s) => ({
      change: s.label,
      turns_per_coil: s.turns,
      wire: s.wire,
      strands_in_hand: s.strands,
      terminal_ohm: s.terminal_ohm,
      copper_fill: s.copper_fill,
      achieved_value: goalValue(kind, s.achieved),
      meets_goal: s.meets_goal,
      rejected_because: s.rejected_because,
    })),
  };
}

/** The whole `plan --json` object (docs/contracts.md, "--json output"), section by section. */
export function planJson(plan: Plan) {
  const { kind } = supplyOf(plan.job);
  const series = plan.job.armature.field === "series";
  return {
    // ok exactly when the exit status is 0 (docs/contracts.md): a plan that meets no goal exits 2
    ok: plan.feasible,
    errors: [] as never[],
    job_id: plan.job.id,
    title: plan.job.title,
    feasible: plan.feasible,
    goal: goalJson(plan),
    supply: { voltage_v: plan.supply, kind, mains: plan.mains },
    design: designJson(plan),
    ...layoutJson(plan),
    coils: coilsJson(plan),
    paths: plan.paths,
    ...readingsAndCutJson(plan),
    motor: motorJson(plan.motor, plan.calibration.source, series ? seriesJson(plan, "rewound") : undefined),
    original_motor: motorJson(plan.original_motor, plan.calibration.source, series ? seriesJson(plan, "original") : undefined),
    series: seriesExtraJson(plan),
    ...originalJson(plan),
    duty: dutyJson(plan),
    ...sweepJson(plan, series),
    learning: plan.learning
      ? { records: plan.learning.records, moves: plan.learning.moves.map((m) => ({ figure: m.figure, unit: m.unit, from_value: m.from, to_value: m.to })) }
      : null,
    warnings: plan.warnings.map((w) => ({ code: w.code, message: w.message, path: w.path })),
  };
}
