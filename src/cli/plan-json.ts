/**
 * The `plan --json` output: DESIGN.md's contract. Keys snake_case, units as the last part of each
 * key, numbers unrounded, unknowable figures null (never absent).
 */
import type { Candidate, MotorReport, Plan } from "../design/types.js";
import type { GoalKind } from "../design/types.js";
import { supplyOf } from "../design/plan.js";
import type { SeriesPoint } from "../motor/series.js";
import { goalSummary } from "../format/goal.js";
import { GOAL_UNIT, convert, goalValue, toAPerMm2, toMm, toRpm } from "../format/units.js";
import { kvFromKe } from "../motor/emf.js";

const n = (x: number | null | undefined): number | null => convert(x, (v) => v);
const mm = (m: number | null | undefined) => convert(m, toMm);
const rpm = (w: number | null | undefined) => convert(w, toRpm);
const density = (j: number | null | undefined) => convert(j, toAPerMm2);

export function wireJson(w: Candidate["wire"]) {
  return {
    label: w.label,
    bare_diameter_mm: w.bare_diameter * 1e3,
    overall_diameter_mm: mm(w.overall_diameter),
    source: w.overall_source,
    system: w.system,
    insulation: w.insulation,
    area_mm2: w.area * 1e6,
    ohm_per_m: w.ohm_per_m,
  };
}

function seriesPointJson(p: SeriesPoint | null) {
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

/** DESIGN.md's `motor.series` for one side (original or new), null members where the job lacks the data. */
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
    copper_mass_g: c.copper_mass * 1e3,
    meets_goal: c.meets_goal,
    rejected_because: c.rejected_because,
  };
}

export function planJson(plan: Plan) {
  const d = plan.design;
  const { kind } = supplyOf(plan.job);
  const series = plan.job.armature.field === "series";
  return {
    ok: true,
    job_id: plan.job.id,
    title: plan.job.title,
    feasible: plan.feasible,
    goal: {
      kind: plan.goal.kind,
      unit: GOAL_UNIT[plan.goal.kind],
      target_value: goalValue(plan.goal.kind, plan.goal.target),
      achieved_value: goalValue(plan.goal.kind, plan.goal.achieved),
      error_fraction: n(plan.goal.error_fraction),
      tolerance: plan.goal.tolerance.below === plan.goal.tolerance.above ? plan.goal.tolerance.below : { below_fraction: plan.goal.tolerance.below, above_fraction: plan.goal.tolerance.above },
      tolerance_below_fraction: plan.goal.tolerance.below,
      tolerance_above_fraction: plan.goal.tolerance.above,
      summary: goalSummary(plan.goal),
    },
    supply: { voltage_v: plan.supply, kind, mains: plan.mains },
    design: {
      turns_per_coil: d.turns,
      strands_in_hand: d.strands,
      wire: wireJson(d.wire),
      copper_fill: d.copper_fill,
      copper_fill_limit: plan.fill_limit,
      space_fill: n(d.space_fill),
      layers: d.build ? d.build.layers : null,
      turns_per_layer: d.build ? d.build.turnsPerLayer : null,
      build_mm: d.build ? d.build.build * 1e3 : null,
      build_room_mm: d.build ? d.build.room * 1e3 : null,
      current_density_a_per_mm2: density(d.current_density),
    },
    winding: {
      style: plan.layout.spec.style,
      slots: plan.layout.spec.slots,
      bars: plan.layout.bars,
      poles: plan.layout.spec.poles,
      span: plan.layout.spec.span,
      coils_per_slot: plan.layout.spec.coils_per_slot,
      progression: plan.layout.spec.progression,
      lead_throw: plan.layout.spec.lead_throw,
      commutator_pitch: plan.layout.commutator_pitch,
      back_pitch: plan.layout.back_pitch,
      front_pitch: plan.layout.front_pitch,
      coil_sides_per_slot: plan.layout.coil_sides_per_slot,
      equalizer_groups: plan.layout.equalizer_groups,
      notes: plan.layout.notes,
    },
    slot: {
      free_area_mm2: plan.slot.free_area * 1e6,
      gross_area_mm2: plan.slot.gross_area * 1e6,
      liner_area_mm2: plan.slot.liner_area * 1e6,
      opening_mm: plan.slot.opening * 1e3,
    },
    coils: plan.coils.map((c) => ({
      index: c.index,
      go_slot: c.go_slot,
      return_slot: c.return_slot,
      layer: c.go_layer,
      return_layer: c.return_layer,
      start_bar: c.start_bar,
      end_bar: c.end_bar,
      turns: c.turns,
      direction: c.direction,
      mean_turn_length_mm: c.mlt * 1e3,
      resistance_ohm: c.dead ? null : c.ohm,
      dead: c.dead,
    })),
    paths: plan.paths,
    resistance: {
      coil_ohm: plan.resistance.coil_ohm,
      bar_to_bar_ohm: plan.resistance.bar_to_bar_ohm,
      bar_to_bar_each_ohm: plan.resistance.bar_to_bar,
      terminal_ohm: plan.resistance.terminal_ohm,
      terminal_min_ohm: plan.resistance.terminal_min_ohm,
      terminal_max_ohm: plan.resistance.terminal_max_ohm,
      terminal_hot_ohm: plan.resistance.terminal_hot_ohm,
      hot_temperature_c: plan.resistance.hot_temperature,
      validity: plan.resistance.validity,
      terminal_basis: plan.resistance.terminal_basis,
    },
    wire: {
      mean_turn_length_mm: plan.wire.mlt * 1e3,
      mean_turn_length_source: plan.wire.mlt_source,
      per_coil_m: plan.wire.per_coil,
      winding_m: plan.wire.winding,
      leads_m: plan.wire.leads,
      cut_m: plan.wire.cut,
      cut_per_strand_m: plan.wire.cut_per_strand,
      copper_mass_g: plan.wire.copper_mass * 1e3,
      spare_margin: plan.wire.spare_margin,
    },
    motor: motorJson(plan.motor, plan.calibration.source, series ? seriesJson(plan, "rewound") : undefined),
    original_motor: motorJson(plan.original_motor, plan.calibration.source, series ? seriesJson(plan, "original") : undefined),
    series: seriesExtraJson(plan),
    original: {
      turns_per_coil: plan.original.turns,
      strands_in_hand: plan.original.strands,
      wire: wireJson(plan.original.wire),
      copper_fill: plan.original.copper_fill,
      mean_turn_length_mm: plan.original.mlt * 1e3,
      terminal_ohm: plan.original.terminal_ohm,
      terminal_measured: plan.original.terminal_measured,
      laid_overall_diameter_mm: mm(plan.original.overall),
      overall_basis: plan.original.overall_basis,
    },
    calibration: {
      source: plan.calibration.source,
      ke_v_s_per_rad: n(plan.calibration.ke),
      uncertainty_fraction: n(plan.calibration.uncertainty),
      basis: plan.calibration.basis,
      loss_torque_n_m: plan.calibration.loss.tc,
      loss_viscous_n_m_s_per_rad: plan.calibration.loss.b,
      loss_basis: plan.calibration.loss_basis,
      generator_no_load_disagreement_fraction: n(plan.calibration.disagreement),
      brush_drop_v: plan.calibration.brush_drop,
      brush_drop_basis: plan.calibration.brush_drop_basis,
    },
    duty: plan.duty
      ? {
          torque_n_m: plan.duty.torque,
          target_speed_rpm: rpm(plan.duty.target_speed),
          current_a: n(plan.duty.current),
          speed_rpm: rpm(plan.duty.speed),
          efficiency: n(plan.duty.efficiency),
          input_w: n(plan.duty.input_w),
          output_w: n(plan.duty.output_w),
          current_density_a_per_mm2: density(plan.duty.current_density),
        }
      : null,
    candidates: plan.candidates.map((c) => candidateJson(c, plan.goal.kind, series)),
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
      achieved_value: goalValue(plan.goal.kind, s.achieved),
      meets_goal: s.meets_goal,
      rejected_because: s.rejected_because,
    })),
    learning: plan.learning
      ? { records: plan.learning.records, moves: plan.learning.moves.map((m) => ({ figure: m.figure, unit: m.unit, from_value: m.from, to_value: m.to })) }
      : null,
    warnings: plan.warnings.map((w) => ({ code: w.code, message: w.message, path: w.path })),
  };
}
