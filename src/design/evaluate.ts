/**
 * ONE evaluation of a winding (turns × wire × strands in hand) on an armature: does it fit, what
 * does each coil measure, what do the ring readings become, what will the motor do, and how close
 * does it come to the goal. Every figure the plan, the card, `log`'s prediction, learning and the
 * bench use comes from here; no caller works any of it out again.
 *
 *  - `cheap` mode (the sweep, hundreds of thousands of calls): the mean coil and the terminal
 *    reading from the coils' turn lengths in closed form (`terminalModel`, equal to the network's),
 *    no per-coil arrays, no ring readings, no motor report. The sweep runs it through `scan`: what
 *    the wire and strands alone decide is worked out once for all turns counts, the figures go into
 *    one reused object, and a Candidate is made only for those the sweep keeps (src/design/sweep.ts).
 *  - `full` mode (the chosen winding, the original, the winding actually laid, learning, bench):
 *    each coil with its own turn length and resistance, the ring network's readings (src/winding/ring.ts),
 *    the motor model's report and the duty point.
 * Both modes compute the fit, fills, turn length, Ke, goal figure and verdict with the same functions.
 *
 * Units: SI (m, m², Ω, V, A, rad/s, N·m, W, kg, A/m²).
 */
import { HEX_PACKING, copperFill, spaceFill } from "../armature/fill.js";
import { fitsLayers, layersOf, passesOpening, slotLayerTable, toothLayerTable, type LayerBuild, type LayerTable } from "../armature/build.js";
import { bundleThickness, meanTurnLength, ridingIncrement } from "../armature/turn.js";
import { copperFactor, COPPER_DENSITY } from "../wire/copper.js";
import type { Wire } from "../wire/types.js";
import { barToBar, coilCurrentShare, ringNetwork, singleBrushBars, terminalResistance } from "../winding/ring.js";
import type { WindingLayout } from "../winding/types.js";
import { currentDensityByShare, densityLimit, type DensityLimit } from "../motor/density.js";
import type { Tolerance } from "../job/schema.js";
import { resolveWire } from "../wire/catalogue.js";
import { withinTolerance } from "./rank.js";
import { keScaledByTurns } from "../motor/emf.js";
import { coilResistance, coilTurnLengths, layingDiameter, meanOf, supplyOf, type ArmatureContext } from "./context.js";
import { motorPhysicsFor, type MotorPhysics } from "./motor.js";
import type { Calibration, Candidate, DutyReport, GoalKind, MotorReport } from "./types.js";

/** Share of the target copper area a restore may fall short by: 3 % (docs/contracts.md, "Choosing among candidates"). */
export const RESTORE_MIN_AREA = 0.97;

/** A winding to evaluate: turns per coil, the wire, strands in hand. */
export interface Winding {
  turns: number;
  wire: Wire;
  strands: number;
}

export type EvalMode = "cheap" | "full";

/** The ring readings of a winding at 20 °C, Ω (src/winding/ring.ts). */
export interface RingReadings {
  /** r1 … rC: between bar i and bar i+1. */
  bar_to_bar: number[];
  /** Brushes each on a single bar. */
  single: number;
  /** Brushes each bridging two bars. */
  bridged: number;
  /** Least and largest over a turn of the rotor (the ring module's figures); min null when the brushes can short the supply through one bar (brush_short). */
  min: number | null;
  max: number;
  /** How the brushes were placed. */
  basis: string;
}

/** The full evaluation: the candidate's figures (from the network) plus each coil, the ring, the motor. */
export interface FullEvaluation extends Candidate {
  /** Each coil's mean turn length, m, in coil index order (a dead coil's too). */
  coil_mlt: number[];
  /** Each coil's resistance at 20 °C, Ω, in coil index order. */
  coil_ohms: number[];
  ring: RingReadings;
  motor: MotorReport;
  duty: DutyReport | null;
}

export interface FullOptions {
  /** A measured terminal resistance at 20 °C (Ω) that wins over the computed one for the motor figures (the original). */
  measuredTerminal20?: number;
  /** The original winding: its motor report on its own supply (a conversion's original runs on the old one). */
  original?: boolean;
}

export interface Evaluator {
  /** The sweep's evaluation (cheap mode). */
  evaluate(turns: number, wire: Wire, strands: number): Candidate;
  /** The same evaluation of one wire and strands at any turns count, its figures first (`WireScan`): what the sweep runs. */
  scan(wire: Wire, strands: number): WireScan;
  /** The full evaluation of a winding. */
  full(w: Winding, options?: FullOptions): FullEvaluation;
  /** Copper fill limit in force. */
  fillLimit: number;
  goal: GoalKind;
  /** Target in SI (rad/s, rad/s per V, A, rad/s for the duty speed, m² for restore and fixed). */
  target: number;
  tolerance: Tolerance;
  /** The current-density limit in force and where it comes from. */
  density: DensityLimit;
  /** Share of the terminal current that heats one coil (1/a with equal paths; src/winding/ring.ts `coilCurrentShare`). */
  currentShare: number;
  /** Checks the original winding itself fails (its space fill when above the limit; the layer model). */
  originalFails: { space_fill: number | null; layer_build: boolean };
  /** The space-fill limit in force (the job's, at most hexagonal packing). */
  spaceLimit: number;
  /** Terminal resistance of a ring of equal coils of 1 Ω (brushes each on one bar). */
  ringFactor: number;
  supply: number;
  /** The motor model of the job (src/design/motor.ts): the plan reads the series model's job-wide figures from it. */
  physics: MotorPhysics;
}

/** What does not change from one winding to the next: limits, target, ring factor, hot factor, the motor model. */
interface Setup {
  ctx: ArmatureContext;
  cal: Calibration;
  physics: MotorPhysics;
  supply: number;
  goal: GoalKind;
  target: number;
  fillLimit: number;
  spaceLimit: number;
  /** Restore: the copper area is the goal. */
  likeRestore: boolean;
  /** The load torque the goal is judged at (N·m): the duty's, or a conversion's rated torque; null for other goals. */
  loadTorque: number | null;
  ringFactor: number;
  hotFactor: number;
  /** Mean riding increment per metre of bundle thickness over the live coils (the increment is linear in it). */
  ridingPerBundle: number;
  /** The terminal reading (Ω) of coils whose turn lengths are base + g_i·b (m), times K (Ω/m): see `terminalModel`. */
  terminalOf: (base: number, b: number, K: number) => number;
  trapezoid: boolean;
  /** Tooth coils: the layer tables lay turns, not conductors. */
  tooth: boolean;
  /** The winding's style and span, for the turn-length model. */
  style: WindingLayout["spec"]["style"];
  span: number;
  tolerance: Tolerance;
  /** Share of the terminal current that heats one coil (`coilCurrentShare`). */
  share: number;
  density: DensityLimit;
  /** A restore at the original's turns: the space and layer checks warn (planJob), they do not reject. */
  geometryChecked: boolean;
  /** The slot's layer tables already worked out, by overall diameter (m) then strands (0 for lap/wave): see `layerTable`. */
  layerTables: Map<number, Map<number, LayerTable>>;
}

/** Riding increment of each coil per metre of bundle thickness (0 for a dead coil): src/armature/turn.ts `ridingIncrement`, linear in the bundle. */
function ridingPerMetre(layout: WindingLayout): number[] {
  const spec = layout.spec;
  return layout.coils.map((c) => (c.dead ? 0 : ridingIncrement(c.rides_over, spec.coils_per_slot, spec.span, 1)));
}

/**
 * The arcs the `single` brushes cut the closed winding into (coil indices in circuit order), and
 * whether each joins a + brush to a − brush. Null when the winding is not one closed loop with
 * every brush on it (equalizers, or a brush bar no live coil starts at).
 */
function brushArcs(layout: WindingLayout): { coils: number[]; conducts: boolean }[] | null {
  if (layout.equalizers) return null;
  const brushes = singleBrushBars(layout);
  const polarity = new Map<number, number>();
  brushes.forEach((bar, j) => polarity.set(bar, j % 2));
  const order = layout.circuit_order;
  const starts = order.map((k) => layout.coils[k - 1].start_bar!);
  const first = starts.findIndex((b) => polarity.has(b));
  if (first < 0 || brushes.some((b) => !starts.includes(b))) return null;
  const arcs: { coils: number[]; conducts: boolean }[] = [];
  let from = starts[first];
  let coils: number[] = [];
  for (let n = 0; n < order.length; n++) {
    const i = (first + n) % order.length;
    coils.push(order[i] - 1);
    const end = layout.coils[order[i] - 1].end_bar!;
    if (polarity.has(end)) {
      arcs.push({ coils, conducts: polarity.get(end) !== polarity.get(from) });
      from = end;
      coils = [];
    }
  }
  return coils.length === 0 ? arcs : null;
}

/**
 * The terminal reading of the \`single\` brushes as a function of the coils' turn lengths
 * base + g_i·b (m) and K = ρ20·N/(k·A) (Ω/m), exact and cheap:
 *  - equal live coils (all g_i alike: tooth windings, coils that ride over none): K·(base + g·b) times
 *    the ring's factor (the network of equal coils, src/winding/ring.ts);
 *  - one closed loop cut into arcs by the brushes (Kirchhoff: the arcs joining a + to a − brush are
 *    in parallel, the others carry no current): 1 / Σ 1/A_j, A_j = K·(n_j·base + G_j·b); checked
 *    once against the ring network at unequal coils and used only when it agrees to 1e-9;
 *  - otherwise the ring network itself, each time.
 */
function terminalModel(layout: WindingLayout, g: number[], ringFactor: number): Setup["terminalOf"] {
  const live = layout.coils.map((c, i) => (c.dead ? null : g[i])).filter((x): x is number => x !== null);
  if (live.every((x) => x === live[0])) return (base, b, K) => K * (base + live[0] * b) * ringFactor;
  const arcs = brushArcs(layout)
    ?.filter((a) => a.conducts)
    .map((a) => ({ n: a.coils.length, G: a.coils.reduce((s, i) => s + g[i], 0) }));
  const network = (base: number, b: number, K: number) => {
    const ohms = g.map((x) => K * (base + x * b));
    const bars = singleBrushBars(layout);
    return ringNetwork(layout, ohms).between(
      bars.filter((_, j) => j % 2 === 0),
      bars.filter((_, j) => j % 2 === 1),
    );
  };
  if (!arcs || arcs.length === 0) return network;
  const byArcs = (base: number, b: number, K: number) => 1 / arcs.reduce((s, a) => s + 1 / (K * (a.n * base + a.G * b)), 0);
  const probe = terminalResistance(
    layout,
    g.map((x) => 1 + 0.37 * x),
  ).single;
  return Math.abs(byArcs(1, 0.37, 1) / probe - 1) < 1e-9 ? byArcs : network;
}

/**
 * The goal's target in SI from the job (restore: the original's copper area, m²; convert: the
 * original's rated speed, rad/s, to be kept at its rated torque on the new supply, src/design/series.ts).
 */
function goalTarget(ctx: ArmatureContext, physics: MotorPhysics): number {
  const t = ctx.job.target;
  switch (t.goal) {
    case "restore":
      return ctx.original.strands * ctx.original.wire.area;
    case "convert":
      return physics.series?.convertSpeed ?? NaN;
    case "fixed":
      return t.fixed!.strands * resolveWire(t.fixed!.wire).area;
    case "no_load_speed":
      return t.no_load_speed!;
    case "kv":
      return t.kv!;
    case "stall_current":
      return t.stall_current!;
    case "duty":
      return t.duty!.speed;
  }
}

function setupFor(ctx: ArmatureContext, cal: Calibration, supply: number): Setup {
  const t = ctx.job.target;
  const layout = ctx.layout;
  const spec = layout.spec;
  const live = layout.coils.filter((c) => !c.dead);
  const slot = ctx.slot;
  const ringFactor = terminalResistance(
    layout,
    layout.coils.map(() => 1),
  ).single;
  const likeRestore = t.goal === "restore";
  const physics = motorPhysicsFor(ctx.job, cal, ctx.original.turns);
  const share = coilCurrentShare(layout).rms;
  const atPoint = t.duty !== undefined || t.rated_current !== undefined;
  return {
    ctx,
    cal,
    physics,
    tolerance: t.tolerance,
    share,
    density: densityLimit(t.limits.current_density, atPoint, originalDensity(ctx, cal, physics, supply, share)),
    geometryChecked: t.goal !== "restore",
    supply,
    goal: t.goal,
    target: goalTarget(ctx, physics),
    likeRestore,
    loadTorque: t.duty?.torque ?? (t.goal === "convert" ? (cal.series?.ratedTorque ?? null) : null),
    // a conversion's winding takes the place of the original's, which fitted: its own fill counts as fitting
    fillLimit: likeRestore || t.goal === "convert" ? Math.max(t.limits.copper_fill, ctx.original.copperFill) : t.limits.copper_fill,
    spaceLimit: Math.min(t.limits.space_fill, HEX_PACKING),
    ringFactor,
    terminalOf: terminalModel(layout, ridingPerMetre(layout), ringFactor),
    hotFactor: copperFactor(t.hot_temperature),
    ridingPerBundle: live.reduce((s, c) => s + ridingIncrement(c.rides_over, spec.coils_per_slot, spec.span, 1), 0) / live.length,
    trapezoid: slot.depth !== null && slot.width_top !== null && slot.width_bottom !== null,
    tooth: spec.style === "tooth",
    style: spec.style,
    span: spec.span,
    layerTables: new Map(),
  };
}

/**
 * The layer table of a wire of overall diameter `overall` (m), `strands` in hand, in this trapezoid
 * slot (src/armature/build.ts): worked out once per wire and strands, since it does not depend on
 * the turns; the sweep then lays each turns count on it.
 */
function layerTable(s: Setup, overall: number, strands: number): LayerTable {
  const sl = s.ctx.slot;
  const tooth = s.ctx.layout.spec.style === "tooth";
  const key = tooth ? strands : 0;
  let byStrands = s.layerTables.get(overall);
  if (!byStrands) {
    byStrands = new Map();
    s.layerTables.set(overall, byStrands);
  }
  let table = byStrands.get(key);
  if (!table) {
    table = tooth
      ? toothLayerTable(strands, overall, sl.depth!, sl.width_top!, sl.width_bottom!, sl.liner)
      : slotLayerTable(overall, sl.depth!, sl.width_top!, sl.width_bottom!, sl.liner);
    byStrands.set(key, table);
  }
  return table;
}

/**
 * What a winding's wire and strands in hand decide whatever its turns: worked out once per wire and
 * strands by the sweep (`scanOf`), once per call otherwise.
 */
interface WireSetup {
  wire: Wire;
  strands: number;
  /** The wire's overall diameter, m; null when unknown (the fit checks then stop at the copper fill). */
  overall: number | null;
  /** The overall diameter the turn-length model lays it at, m (src/design/context.ts `layingDiameter`). */
  laying: number;
  /** Do the strands pass the slot opening (src/armature/build.ts `passesOpening`)? True when the overall diameter is unknown (not checked). */
  opening: boolean;
  /** The slot's layer table for it (`layerTable`); null without a trapezoid slot or without an overall diameter. */
  table: LayerTable | null;
}

function wireSetup(s: Setup, wire: Wire, strands: number): WireSetup {
  const overall = wire.overall_diameter;
  return {
    wire,
    strands,
    overall,
    laying: layingDiameter(wire),
    opening: overall === null || passesOpening(overall, strands, s.ctx.slot.opening),
    table: overall !== null && s.trapezoid ? layerTable(s, overall, strands) : null,
  };
}

/**
 * A winding's figures as the evaluation works them out: the Candidate's, all but its layer build
 * (`toCandidate` lays it). The sweep reads them from one object it reuses (`WireScan`).
 */
export type WindingFigures = Omit<Candidate, "build">;

/** Figures to be filled in (every field present, so that the object keeps one shape). */
function emptyFigures(): WindingFigures {
  return {
    turns: 0,
    strands: 0,
    wire: undefined as unknown as Wire,
    copper_fill: 0,
    space_fill: null,
    mlt: 0,
    coil_ohm: 0,
    terminal_ohm: 0,
    terminal_hot_ohm: 0,
    ke: null,
    achieved: null,
    error: null,
    meets_goal: false,
    rejected_because: [],
    copper_mass: 0,
    current_density: null,
    stall_current_hot: null,
    stall_current_cold: null,
    duty_input_w: null,
  };
}

/** Copper fill, space fill, layer build and opening against the limits (src/armature/fill.ts, build.ts), into `f`. */
function fitChecks(s: Setup, p: WireSetup, turns: number, f: WindingFigures): void {
  const { slot, sides } = s.ctx;
  const reasons = f.rejected_because;
  const conductors = sides * turns * p.strands;
  f.copper_fill = copperFill(conductors, p.wire.area, slot.free_area);
  if (f.copper_fill > s.fillLimit + 1e-12) reasons.push("copper_fill");
  if (p.overall === null) {
    reasons.push("overall_unknown");
    f.space_fill = null;
    return;
  }
  f.space_fill = spaceFill(conductors, p.overall, slot.free_area);
  if (f.space_fill > s.spaceLimit + 1e-12 && s.geometryChecked) reasons.push("space_fill");
  if (!p.opening) reasons.push("slot_opening");
  if (p.table !== null && !fitsLayers(s.tooth ? turns : conductors, p.table) && s.geometryChecked) reasons.push("layer_build");
}

/** The layer build of `turns` with this wire and strands (src/armature/build.ts `layersOf`); null when `fitChecks` had no table. */
function buildOf(s: Setup, p: WireSetup, turns: number): LayerBuild | null {
  return p.table === null ? null : layersOf(s.tooth ? turns : s.ctx.sides * turns * p.strands, p.table);
}

/**
 * The motor figures a goal needs, from the motor model (src/design/motor.ts), into `f`: Ke scaled by
 * turns (Ke_new = Ke_orig·N_new/N_orig), stall currents hot and cold, the goal's figure (no-load
 * speed with the cold resistance, Kv as 1/Ke in rad/s per V, duty speed with the hot one), and the
 * current density at the duty point or the rated current, J = I/(a·k·A) (src/motor/density.ts).
 */
function goalFigures(s: Setup, p: WireSetup, turns: number, terminal20: number, f: WindingFigures): void {
  const { ctx, cal, physics, supply } = s;
  const t = ctx.job.target;
  const ke = cal.ke === null ? null : keScaledByTurns(cal.ke, ctx.original.turns, turns);
  f.ke = ke;
  f.achieved = null;
  f.stall_current_hot = physics.stallCurrent(ke, turns, terminal20, s.hotFactor, supply);
  f.stall_current_cold = physics.stallCurrent(ke, turns, terminal20, 1, supply);
  f.current_density = null;
  f.duty_input_w = null;
  let dutyCurrent: number | null = null;
  switch (s.goal) {
    case "restore":
    case "fixed":
      f.achieved = p.strands * p.wire.area;
      break;
    case "no_load_speed":
      if (ke !== null) f.achieved = physics.noLoad(ke, turns, terminal20, 1, supply)?.speed ?? null;
      break;
    case "kv":
      // Kv in rad/s per volt: the constant 1/Ke (60/(2π·Ke) rpm/V), or no-load speed ÷ supply (docs "Kv")
      if (ke !== null && t.kv_basis === "no_load") f.achieved = (physics.noLoad(ke, turns, terminal20, 1, supply)?.speed ?? 0) / supply;
      else if (ke !== null) f.achieved = 1 / ke;
      break;
    case "stall_current":
      f.achieved = f.stall_current_cold;
      break;
    case "duty":
    case "convert":
      // the speed at the load torque (a conversion: the original's rated torque on the new supply), hot
      if (physics.canPredict(ke) && s.loadTorque !== null) {
        const point = physics.atTorque(ke, turns, terminal20, s.hotFactor, supply, s.loadTorque);
        f.achieved = point ? point.speed : 0;
        f.duty_input_w = point ? point.inputW : null;
        dutyCurrent = point?.current ?? null;
      }
      break;
  }
  const dc = dutyCurrent ?? t.rated_current ?? null;
  if (dc !== null) f.current_density = currentDensityByShare(dc, s.share, p.strands, p.wire.area);
}

/**
 * The limits on current, the error against the target (into `f.error`) and whether the goal is met
 * (docs/contracts.md "Choosing among candidates").
 */
function verdict(s: Setup, f: WindingFigures): boolean {
  const t = s.ctx.job.target;
  const lim = t.limits;
  const cap = s.density.limit;
  const reasons = f.rejected_because;
  if (cap !== null && f.current_density !== null && f.current_density > cap) reasons.push("current_density");
  if (lim.hot_stall_current !== undefined && f.stall_current_hot !== null && f.stall_current_hot > lim.hot_stall_current) reasons.push("hot_stall_current");
  f.error = null;
  if (f.achieved === null) return false;
  const error = (f.achieved - s.target) / s.target;
  f.error = Number.isFinite(error) ? error : null;
  if (s.likeRestore) {
    const meets = f.achieved >= RESTORE_MIN_AREA * s.target;
    if (!meets) reasons.push("below_original_copper");
    return meets;
  }
  if (s.goal === "fixed") return true; // the user chose it: a limit it breaks is a warning (planJob), not a rejection
  // stall_current is a limit: its bare tolerance t is { below: t, above: 0 } (src/job/schema.ts)
  return withinTolerance(error, t.tolerance);
}

/** The figures of `turns` per coil with this wire and strands, whose mean turn is `mlt` (m), mean coil `coilOhm` and terminal reading `terminal20` (Ω, 20 °C), into `f`. */
function figuresOf(s: Setup, p: WireSetup, turns: number, mlt: number, coilOhm: number, terminal20: number, f: WindingFigures): WindingFigures {
  f.turns = turns;
  f.strands = p.strands;
  f.wire = p.wire;
  const reasons = f.rejected_because;
  while (reasons.length > 0) reasons.pop(); // emptied in place (setting length is a runtime call)
  fitChecks(s, p, turns, f);
  f.mlt = mlt;
  f.coil_ohm = coilOhm;
  f.terminal_ohm = terminal20;
  f.terminal_hot_ohm = terminal20 * s.hotFactor;
  goalFigures(s, p, turns, terminal20, f);
  f.meets_goal = verdict(s, f) && (s.goal === "fixed" || f.rejected_because.length === 0);
  f.copper_mass = COPPER_DENSITY * p.wire.area * p.strands * turns * mlt * s.ctx.woundCoils;
  return f;
}

/** The Candidate of figures `f` worked out for this wire and strands: a new object, its layer build laid. */
function toCandidate(s: Setup, p: WireSetup, f: WindingFigures): Candidate {
  return {
    turns: f.turns,
    strands: f.strands,
    wire: f.wire,
    copper_fill: f.copper_fill,
    space_fill: f.space_fill,
    build: buildOf(s, p, f.turns),
    mlt: f.mlt,
    coil_ohm: f.coil_ohm,
    terminal_ohm: f.terminal_ohm,
    terminal_hot_ohm: f.terminal_hot_ohm,
    ke: f.ke,
    achieved: f.achieved,
    error: f.error,
    meets_goal: f.meets_goal,
    rejected_because: f.rejected_because.slice(),
    copper_mass: f.copper_mass,
    current_density: f.current_density,
    stall_current_hot: f.stall_current_hot,
    stall_current_cold: f.stall_current_cold,
    duty_input_w: f.duty_input_w,
  };
}

/**
 * Cheap mode, into `f`: the coils' turn lengths base + g_i·b (m), b the bundle thickness, base the
 * model's 2L + f·end turns (or the measured turn less the mean riding increment, so that the mean is
 * the measured one); the mean coil R = ρ20·N·MLT/(k·A); the terminal reading from `terminalModel`.
 */
function cheapFigures(s: Setup, p: WireSetup, turns: number, f: WindingFigures): WindingFigures {
  const ctx = s.ctx;
  const b = bundleThickness(turns, p.strands, p.laying, ctx.along);
  const base = ctx.mltMeasured !== null ? ctx.mltMeasured - s.ridingPerBundle * b : meanTurnLength(s.style, ctx.core, s.span, b, ctx.mltFactor);
  const mlt = ctx.mltMeasured ?? base + s.ridingPerBundle * b;
  const K = coilResistance(turns, 1, p.strands, p.wire.area);
  return figuresOf(s, p, turns, mlt, K * mlt, s.terminalOf(base, b, K), f);
}

/**
 * The sweep's evaluation of one wire and strands in hand at any turns count: the figures first
 * (`figures`, into one object overwritten by the next call, nothing made), the Candidate only for
 * the figures the sweep keeps (`candidate`, equal to `Evaluator.evaluate`'s).
 */
export interface WireScan {
  figures(turns: number): Readonly<WindingFigures>;
  /** The Candidate of the figures last worked out: a new object each call. */
  candidate: () => Candidate;
}

function scanOf(s: Setup, wire: Wire, strands: number): WireScan {
  const p = wireSetup(s, wire, strands);
  const f = emptyFigures();
  return { figures: (turns) => cheapFigures(s, p, turns, f), candidate: () => toCandidate(s, p, f) };
}

/** Cheap mode: the Candidate of `cheapFigures`. */
function evaluateCheap(s: Setup, w: Winding): Candidate {
  const p = wireSetup(s, w.wire, w.strands);
  return toCandidate(s, p, cheapFigures(s, p, w.turns, emptyFigures()));
}
/** The duty report of a winding at its duty point (null without a duty goal, or beyond stall); `r20` its terminal resistance at 20 °C (Ω). */
function dutyOf(s: Setup, w: Winding, ke: number | null, r20: number): DutyReport | null {
  const d = s.ctx.job.target.duty;
  if (!d || !s.physics.canPredict(ke)) return null;
  const p = s.physics.atTorque(ke, w.turns, r20, s.hotFactor, s.supply, d.torque);
  if (p === null) return null;
  const field = s.physics.fieldCurrent(s.hotFactor, s.supply);
  return {
    torque: d.torque,
    target_speed: d.speed,
    current: p.current,
    terminal_current: field === null ? null : p.current + field,
    speed: p.speed,
    efficiency: s.physics.lossKnown ? p.efficiency : null,
    input_w: p.inputW,
    output_w: p.outputW,
    current_density: currentDensityByShare(p.current, s.share, w.strands, w.wire.area),
  };
}

/** Full mode: each coil's turn length and resistance, the ring network's readings, the motor report and duty point. */
function evaluateFull(s: Setup, w: Winding, options: FullOptions = {}): FullEvaluation {
  const { layout } = s.ctx;
  const coilMlt = coilTurnLengths(s.ctx, w.turns, w.strands, layingDiameter(w.wire));
  const coilOhms = coilMlt.map((m) => coilResistance(w.turns, m, w.strands, w.wire.area));
  const t = terminalResistance(layout, coilOhms);
  const ring: RingReadings = {
    bar_to_bar: barToBar(layout, coilOhms),
    single: t.single,
    bridged: t.bridged,
    // the least over a turn of these brushes, or null when they can short the supply through one bar;
    // the "bridged" set is left out: brushes under a bar wide never reach it (on 3 bars it is a short)
    min: t.min === null ? null : Math.min(t.min, t.single),
    max: Math.max(t.max, t.single),
    basis: t.validity,
  };
  const p = wireSetup(s, w.wire, w.strands);
  const c = toCandidate(s, p, figuresOf(s, p, w.turns, meanOf(coilMlt, layout), meanOf(coilOhms, layout), t.single, emptyFigures()));
  const r20 = options.measuredTerminal20 ?? t.single;
  const motor = s.physics.report(c.ke, w.turns, r20, s.hotFactor, s.supply, options.original ? "original" : "new");
  return { ...c, coil_mlt: coilMlt, coil_ohms: coilOhms, ring, motor, duty: dutyOf(s, w, c.ke, r20) };
}

/**
 * The evaluator of one armature and calibration at the job's supply (V): the setup done once, both
 * modes, and the motor model in use (src/design/motor.ts).
 */
export function makeEvaluator(ctx: ArmatureContext, cal: Calibration, supply = supplyOf(ctx.job).volts): Evaluator {
  const s = setupFor(ctx, cal, supply);
  return {
    evaluate: (turns, wire, strands) => evaluateCheap(s, { turns, wire, strands }),
    scan: (wire, strands) => scanOf(s, wire, strands),
    full: (w, options) => evaluateFull(s, w, options),
    fillLimit: s.fillLimit,
    goal: s.goal,
    target: s.target,
    tolerance: s.tolerance,
    density: s.density,
    currentShare: s.share,
    originalFails: originalChecks(s),
    spaceLimit: s.spaceLimit,
    ringFactor: s.ringFactor,
    supply,
    physics: s.physics,
  };
}

/**
 * The checks the original winding itself fails: its space fill (when above the limit, else null)
 * and whether the layer model says its turns do not fit (trapezoid slots only), with the old
 * wire's overall diameter as laid (src/design/context.ts `layingOverall`).
 */
function originalChecks(s: Setup): { space_fill: number | null; layer_build: boolean } {
  const { ctx } = s;
  const o = ctx.original;
  const overall = layingDiameter(o.wire);
  const conductors = ctx.sides * o.turns * o.strands;
  const sf = spaceFill(conductors, overall, ctx.slot.free_area);
  const layer = s.trapezoid && !layersOf(ctx.layout.spec.style === "tooth" ? o.turns : conductors, layerTable(s, overall, o.strands)).fits;
  return { space_fill: sf > s.spaceLimit + 1e-12 ? sf : null, layer_build: layer };
}

/**
 * The original winding's current density in each strand (A/m²) where the limit is checked: its
 * duty current at the duty torque (hot, calibrated model), else the rated current; null when
 * neither can be known. J = I·share/(k·A) (src/motor/density.ts).
 */
function originalDensity(ctx: ArmatureContext, cal: Calibration, physics: MotorPhysics, supply: number, share: number): number | null {
  const t = ctx.job.target;
  const o = ctx.original;
  let current: number | null = t.rated_current ?? null;
  const ke = cal.ke;
  if (t.duty && physics.canPredict(ke)) {
    current = physics.atTorque(ke, o.turns, o.terminal20, copperFactor(t.hot_temperature), supply, t.duty.torque)?.current ?? null;
  }
  return current === null ? null : currentDensityByShare(current, share, o.strands, o.wire.area);
}

/**
 * Evaluate a winding on an armature with a calibration at the job's supply: `cheap` for the
 * sweep, `full` for everything else. Units SI.
 */
export function evaluateWinding(ctx: ArmatureContext, cal: Calibration, w: Winding, mode: "full", options?: FullOptions): FullEvaluation;
export function evaluateWinding(ctx: ArmatureContext, cal: Calibration, w: Winding, mode: "cheap"): Candidate;
export function evaluateWinding(ctx: ArmatureContext, cal: Calibration, w: Winding, mode: EvalMode, options?: FullOptions): Candidate | FullEvaluation {
  const s = setupFor(ctx, cal, supplyOf(ctx.job).volts);
  return mode === "full" ? evaluateFull(s, w, options) : evaluateCheap(s, w);
}
