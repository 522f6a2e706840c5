/**
 * Coil tables for tooth, lap and wave windings, numbered as docs/contracts.md "Numbering and directions"
 * fixes it, with the textbook pitches, parallel paths, equalizer groups, the riding count of each
 * coil and the checks that every table must pass.
 *
 * Textbook rules used here (any electrical-machines textbook, e.g. M. G. Say "The Performance and
 * Design of Direct Current Machines", B. L. Theraja "A Textbook of Electrical Technology", ch.
 * "Armature windings"; from memory):
 *  - simplex lap: commutator pitch y_c = ±1, parallel paths a = P, y_b − y_f = ±2 (coil sides);
 *  - simplex wave: y_c = (C ± 1)/p, a = 2, y_b + y_f = 2·y_c; when (C ± 1)/p is not a whole number
 *    the trade leaves one coil unconnected (a "dead" or dummy coil) and uses C − 1 bars;
 *  - lap windings with more than 2 poles: bars 2C/P apart are at the same potential and are joined
 *    by equalizer connections (Say; Theraja, "equalizing connections").
 * Units: counts and bar/slot numbers only; angles in radians.
 */
import { inputError, type Warning } from "../errors.js";
import { brushShortWarning } from "./ring.js";
import type { Coil, Layer, WindingLayout, WindingSpec } from "./types.js";

/** Span limit: a coil may exceed the pole pitch S/P by at most one slot (common practice, no published source). */
export const SPAN_OVER_POLE_PITCH = 1;

/** Below this fraction of the pole pitch a lap or wave span draws a warning (common practice, no published source). */
export const SHORT_SPAN_FRACTION = 0.5;

const mod1 = (n: number, m: number) => ((((n - 1) % m) + m) % m) + 1;

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a;
}

const isCount = (x: number, min: number) => Number.isInteger(x) && x >= min;

/** The nearest multiples of m below and above n (both when n is not one), as "a or b". */
function nearestMultiples(n: number, m: number): string {
  const lo = Math.floor(n / m) * m;
  const hi = lo + m;
  return lo >= m ? `${lo} or ${hi}` : `${hi}`;
}

/**
 * Refuse a winding spec that no coil table can follow, each problem one located line naming what
 * would be right: the counts and words every style shares, then the style's own rules (tooth,
 * lap, wave: their bar counts, spans and pitches).
 */
function checkSpec(spec: WindingSpec): void {
  checkCommon(spec);
  if (spec.style === "tooth") {
    checkTooth(spec);
  } else {
    checkSpan(spec);
    if (spec.style === "lap") checkLap(spec);
    else checkWave(spec);
  }
}

/** Style, counts, poles in pairs, progression, direction, lead throw, brushes, a dead coil only on a wave. */
function checkCommon(spec: WindingSpec): void {
  const { style, slots: S, bars: C, poles: P, coils_per_slot: u } = spec;
  if (style !== "tooth" && style !== "lap" && style !== "wave") {
    throw inputError("style_unknown", "winding.style", `winding style '${String(style)}' is not known; use tooth, lap or wave`);
  }
  if (!isCount(S, 2)) throw inputError("slots_invalid", "armature.slots", `slots must be a whole number of at least 2 (got ${S})`);
  if (!isCount(C, 2)) throw inputError("bars_invalid", "armature.bars", `bars must be a whole number of at least 2 (got ${C})`);
  if (!isCount(P, 1)) throw inputError("poles_invalid", "armature.field_poles", `field poles must be a whole number, 2 or more (got ${P})`);
  if (P % 2 !== 0) {
    throw inputError("odd_poles", "armature.field_poles", `poles come in pairs; ${P} is odd (nearest: ${P === 1 ? "2" : `${P - 1} or ${P + 1}`})`);
  }
  if (!isCount(u, 1)) throw inputError("coils_per_slot_invalid", "winding.coils_per_slot", `coils per slot must be a whole number of at least 1 (got ${u})`);
  if (spec.progression !== "progressive" && spec.progression !== "retrogressive") {
    throw inputError("progression_unknown", "winding.progression", `progression '${String(spec.progression)}' is not known; use progressive or retrogressive`);
  }
  if (spec.direction !== "cw" && spec.direction !== "ccw") {
    throw inputError("direction_unknown", "winding.direction", `direction '${String(spec.direction)}' is not known; use cw or ccw`);
  }
  if (!Number.isFinite(spec.lead_throw))
    throw inputError("lead_throw_invalid", "winding.lead_throw", `lead throw must be a number of bars (got ${spec.lead_throw})`);
  const b = spec.brushes;
  if (!isCount(b.count, 2) || b.count % 2 !== 0 || b.count > P) {
    const near = Math.max(2, Math.min(P, 2 * Math.round(b.count / 2) || 2));
    throw inputError(
      "brushes_count_invalid",
      "winding.brushes.count",
      `brushes come in +/− pairs, 2 up to one per pole (${P}); ${b.count} does not fit (nearest: ${near})`,
    );
  }
  if (!(b.width_bars > 0) || !Number.isFinite(b.width_bars)) {
    throw inputError(
      "brush_width_invalid",
      "winding.brushes.width_bars",
      `brush width must be a positive number of bars (got ${b.width_bars}); 1 is one bar wide`,
    );
  }
  if (spec.dead_coil && style !== "wave") {
    throw inputError("dead_coil_not_wave", "winding.dead_coil", `a dead coil belongs to wave windings only; set dead_coil: false for a ${style} winding`);
  }
}

/** A tooth winding: one coil per tooth spanning one tooth, a bar per tooth, no more poles than teeth. */
function checkTooth(spec: WindingSpec): void {
  const { slots: S, bars: C, poles: P, span, coils_per_slot: u } = spec;
  if (span !== 1) throw inputError("span_invalid", "winding.span", `a tooth coil spans one tooth: span must be 1 (got ${span})`);
  if (u !== 1)
    throw inputError("coils_per_slot_invalid", "winding.coils_per_slot", `a tooth winding has one coil per tooth: coils_per_slot must be 1 (got ${u})`);
  if (C !== S) {
    throw inputError("bars_mismatch", "armature.bars", `a tooth winding has one bar per tooth: bars must equal slots (${S}), got ${C}`);
  }
  if (P > S) {
    // a tooth then spans more than a pole pitch: a coil's two sides lie under poles of the same
    // polarity and partly cancel, and brushes a pole pitch apart would meet on one bar
    const fit = P - 2 * Math.ceil((P - S) / 2);
    throw inputError(
      "poles_invalid",
      "armature.field_poles",
      `a tooth winding needs at least as many teeth as field poles: ${P} poles on ${S} teeth put each coil across more than a pole pitch, where its sides cancel; count the stator's poles again (at most ${fit} here) or the slots`,
    );
  }
}

/** Lap and wave: a whole span of at least one slot, at most the pole pitch plus {SPAN_OVER_POLE_PITCH} slot; no wave on 2 poles. */
function checkSpan(spec: WindingSpec): void {
  const { style, slots: S, poles: P, span } = spec;
  const pitch = S / P;
  const maxSpan = Math.min(S - 1, Math.floor(pitch + SPAN_OVER_POLE_PITCH));
  if (!Number.isInteger(span)) {
    throw inputError(
      "span_invalid",
      "winding.span",
      `span must be a whole number of slots (got ${span}); full pitch here is ${Math.max(1, Math.round(pitch))}`,
    );
  }
  if (span < 1) {
    throw inputError(
      "span_zero",
      "winding.span",
      `span ${span} would put both sides of a coil in one slot; the smallest span is 1, full pitch here is ${Math.max(1, Math.round(pitch))}`,
    );
  }
  if (span > maxSpan) {
    throw inputError(
      "span_too_long",
      "winding.span",
      `span ${span} exceeds the pole pitch (${fmt(pitch)} slots) by more than ${SPAN_OVER_POLE_PITCH} slot (common practice); the nearest valid span is ${Math.max(1, maxSpan)}`,
    );
  }
  if (style === "wave" && P === 2) {
    throw inputError(
      "wave_two_poles",
      "winding.style",
      `on 2 poles a wave winding's commutator pitch (C ± 1)/1 is ±1 bar: it is a lap winding; use style: lap`,
    );
  }
}

/** A lap winding: bars = coils per slot × slots, divisible by the pole pairs above 2 poles. */
function checkLap(spec: WindingSpec): void {
  const { slots: S, bars: C, poles: P, coils_per_slot: u } = spec;
  const live = u * S;
  if (C !== live) {
    const hint = C % S === 0 ? `; bars ${C} = ${C / S} × slots: set coils_per_slot: ${C / S}` : "";
    throw inputError(
      "bars_mismatch",
      "armature.bars",
      `a lap winding with ${u} coil${u > 1 ? "s" : ""} per slot on ${S} slots has ${live} bars, got ${C}${hint}; valid bar counts are multiples of the slots (${S}, ${2 * S}, ${3 * S} …)`,
    );
  }
  const p = P / 2;
  if (p > 1) {
    if (S % p !== 0) {
      throw inputError(
        "lap_not_divisible",
        "armature.slots",
        `a ${P}-pole lap winding needs slots divisible by the ${p} pole pairs; ${S} is not (nearest: ${nearestMultiples(S, p)} slots)`,
      );
    }
    if (C % p !== 0) {
      throw inputError(
        "lap_not_divisible",
        "armature.bars",
        `a ${P}-pole lap winding needs bars divisible by the ${p} pole pairs; ${C} is not (nearest: ${nearestMultiples(C, p)} bars)`,
      );
    }
  }
}

/** A wave winding: bars = coils (one less with a dead coil), and a whole commutator pitch (C ± 1)/p in the direction asked. */
function checkWave(spec: WindingSpec): void {
  const { slots: S, bars: C, poles: P, coils_per_slot: u } = spec;
  const live = u * S;
  const p = P / 2;
  if (spec.dead_coil) {
    if (C !== live - 1) {
      throw inputError(
        "dead_coil_bars",
        "armature.bars",
        `with a dead coil, bars are one less than the ${live} coils (${u} per slot × ${S} slots): ${live - 1}, got ${C}; or set dead_coil: false`,
      );
    }
  } else if (C !== live) {
    const hint =
      C === live - 1
        ? `; bars one less than coils means a dead coil: set dead_coil: true`
        : C % S === 0
          ? `; bars ${C} = ${C / S} × slots: set coils_per_slot: ${C / S}`
          : "";
    throw inputError(
      "bars_mismatch",
      "armature.bars",
      `a wave winding with ${u} coil${u > 1 ? "s" : ""} per slot on ${S} slots has ${live} bars (or ${live - 1} with a dead coil), got ${C}${hint}`,
    );
  }
  if ((C + 1) % p !== 0 && (C - 1) % p !== 0) {
    const works: number[] = [];
    for (let uu = 1; uu <= Math.max(4, u + 2) && works.length < 4; uu++) {
      const c = uu * S;
      if ((c + 1) % p === 0 || (c - 1) % p === 0) works.push(c);
    }
    const dead = !spec.dead_coil && ((live - 1 + 1) % p === 0 || (live - 1 - 1) % p === 0);
    const ways: string[] = [];
    if (dead) ways.push(`the trade leaves one coil dead: set dead_coil: true with ${live - 1} bars`);
    if (works.length) ways.push(`${works.join(" or ")} bars (coils_per_slot ${works.map((c) => c / S).join(" or ")}) give a whole pitch`);
    throw inputError(
      "wave_no_pitch",
      "armature.bars",
      `a ${P}-pole wave winding needs (bars ± 1)/${p} to be a whole number; ${C} bars give ${fmt((C + 1) / p)} and ${fmt((C - 1) / p)}${ways.length ? `: ${ways.join("; or ")}` : "; choose another bar count"}`,
    );
  }
  const yc = spec.progression === "progressive" ? (C + 1) / p : (C - 1) / p;
  if (!Number.isInteger(yc)) {
    const other = spec.progression === "progressive" ? "retrogressive" : "progressive";
    throw inputError(
      "wave_no_pitch",
      "winding.progression",
      `a ${spec.progression} wave on ${C} bars and ${P} poles needs (bars ${spec.progression === "progressive" ? "+" : "−"} 1)/${p} whole, it is ${fmt(yc)}; use progression: ${other}`,
    );
  }
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toFixed(2);
}

/**
 * A lap or wave coil of a two-layer winding: its go slot is the slot of its start bar, ⌈start/u⌉,
 * in the top layer at the start bar's position among the slot's u coils; its return side lies
 * `span` slots on, in the bottom layer (docs/contracts.md "Numbering and directions").
 */
function twoLayerCoil(index: number, start: number, end: number, u: number, span: number, S: number): Coil {
  const go = Math.ceil(start / u);
  const pos = ((start - 1) % u) + 1;
  return {
    index,
    go_slot: go,
    return_slot: mod1(go + span, S),
    go_layer: "top",
    return_layer: "bottom",
    go_position: pos,
    return_position: pos,
    start_bar: start,
    end_bar: end,
    direction: null,
    dead: false,
    rides_over: 0,
  };
}

/** What each style's builder gives: the coil table, its pitches and paths, notes and warnings. */
interface StyleTable {
  coils: Coil[];
  paths: number;
  yc: number;
  yb: number | null;
  yf: number | null;
  perAdjacent: number;
  groups: number[][];
  notes: string[];
  warnings: Warning[];
}

function emptyTable(): StyleTable {
  return { coils: [], paths: 2, yc: 1, yb: null, yf: null, perAdjacent: 1, groups: [], notes: [], warnings: [] };
}

/** Tooth windings: coil k round tooth k, bar k to bar k+1, go and return slots following the sense (docs/contracts.md "Numbering and directions"). */
function toothTable(spec: WindingSpec): StyleTable {
  const { slots: S, bars: C } = spec;
  const t = emptyTable();
  const { coils, notes } = t;
  for (let k = 1; k <= S; k++) {
    // docs/contracts.md "Numbering and directions": seen from outside at the tooth tip, commutator end up,
    // slot k+1 lies to the left of slot k; cw goes into slot k and back through slot k+1, ccw the reverse.
    // Coil k's side in slot k sits in that slot's clockwise ("right") half, its side in slot k+1 in the other.
    const cw = spec.direction === "cw";
    coils.push({
      index: k,
      go_slot: cw ? k : mod1(k + 1, S),
      return_slot: cw ? mod1(k + 1, S) : k,
      go_layer: cw ? "right" : "left",
      return_layer: cw ? "left" : "right",
      go_position: 1,
      return_position: 1,
      start_bar: k,
      end_bar: mod1(k + 1, C),
      direction: spec.direction,
      dead: false,
      rides_over: 0,
    });
  }
  notes.push(
    `Tooth winding: coil k is wound ${spec.direction === "cw" ? "clockwise" : "anticlockwise"} round tooth k (looking at the tooth tip from outside, commutator end up), from bar k to bar k+1, ${spec.direction === "cw" ? "into slot k and back through slot k+1" : "into slot k+1 and back through slot k"}; each slot k holds coil k's side in its clockwise half and coil k−1's in the other.`,
  );
  return t;
}

/** Simplex lap windings: coil k from bar k to bar k±1, go slot ⌈k/u⌉; equalizer groups for P > 2. */
function lapTable(spec: WindingSpec): StyleTable {
  const { bars: C, slots: S, poles: P, span, coils_per_slot: u } = spec;
  const p = P / 2;
  const t = emptyTable();
  const { coils, notes, warnings, groups } = t;
  const prog = spec.progression === "progressive";
  t.yc = prog ? 1 : -1;
  for (let k = 1; k <= C; k++) coils.push(twoLayerCoil(k, k, mod1(prog ? k + 1 : k - 1, C), u, span, S));
  const yb = 2 * u * span + 1;
  t.yb = yb;
  t.yf = prog ? yb - 2 : yb + 2;
  t.paths = P;
  if (p > 1) {
    const step = C / p; // 2C/P bars between equipotential points
    for (let b = 1; b <= step; b++) {
      const g: number[] = [];
      for (let j = 0; j < p; j++) g.push(b + j * step);
      groups.push(g);
    }
    notes.push(
      `Equalizer groups: bars ${step} apart (2C/P) are at the same potential; ${groups.length} groups of ${p} bars (${groups
        .slice(0, 3)
        .map((g) => g.join("–"))
        .join(
          ", ",
        )}${groups.length > 3 ? " …" : ""}). Equalizer connections are rings or jumpers behind the commutator (or at the back end) joining the risers of each group; the trade often fits every second or third group.`,
    );
    if (!spec.equalizers) {
      warnings.push({
        code: "lap_without_equalizers",
        path: "winding.equalizers",
        message: `a ${P}-pole lap winding without equalizers lets circulating currents flow between its ${P} paths when the poles are unequal (sparking, heating); fit equalizers to the ${groups.length} groups of bars ${step} apart, or confirm the original had none`,
      });
    }
    if (spec.brushes.count < P && !spec.equalizers) {
      warnings.push({
        code: "lap_brushes_fewer_than_poles",
        path: "winding.brushes.count",
        message: `a ${P}-pole lap winding uses its ${P} paths with ${P} brushes (or with equalizers fitted); with ${spec.brushes.count} brushes the computed paths (${P}) and the terminal readings disagree`,
      });
    }
  } else if (spec.equalizers) {
    warnings.push({
      code: "equalizers_not_needed",
      path: "winding.equalizers",
      message: "a 2-pole lap winding has no equipotential bars to equalize; equalizers ignored",
    });
  }
  return t;
}

/** Simplex wave windings: coils in circuit order, commutator pitch (C ± 1)/p, a dead coil last. */
function waveTable(spec: WindingSpec): StyleTable {
  const { bars: C, slots: S, poles: P, span, coils_per_slot: u } = spec;
  const p = P / 2;
  const t = emptyTable();
  const { coils, notes, warnings } = t;
  const yc = spec.progression === "progressive" ? (C + 1) / p : (C - 1) / p;
  t.yc = yc;
  t.perAdjacent = p;
  for (let k = 1; k <= C; k++) coils.push(twoLayerCoil(k, mod1(1 + (k - 1) * yc, C), mod1(1 + k * yc, C), u, span, S));
  if (spec.dead_coil) {
    coils.push({
      index: C + 1,
      go_slot: S,
      return_slot: mod1(S + span, S),
      go_layer: "top",
      return_layer: "bottom",
      go_position: u,
      return_position: u,
      start_bar: null,
      end_bar: null,
      direction: null,
      dead: true,
      rides_over: 0,
    });
    notes.push(
      `Dead coil: coil ${C + 1} (slot ${S} to slot ${mod1(S + span, S)}, last position) is wound like the others for balance, but its ends are cut short, insulated and left unconnected; ${u * S} coils on ${C} bars.`,
    );
  }
  t.yb = 2 * u * span + 1;
  t.yf = 2 * yc - t.yb;
  t.paths = 2;
  notes.push(
    `Wave winding: each coil's finish goes ${yc} bars on (commutator pitch (C ${spec.progression === "progressive" ? "+" : "−"} 1)/p); ${p} coils lie in series between adjacent bars; 2 parallel paths whatever the poles.`,
  );
  if (spec.equalizers) {
    warnings.push({
      code: "equalizers_not_needed",
      path: "winding.equalizers",
      message: "a simplex wave winding needs no equalizers (its 2 paths each pass under every pole); equalizers ignored",
    });
  }
  return t;
}

/**
 * Lay out the winding: the coil table in winding order with go/return slots, layers, bars,
 * pitches, paths, equalizer groups, riding counts, notes and warnings.
 * Throws `ArmwindError` (status 1) with a code and a path under `winding.*` or `armature.*` for
 * a combination the trade does not wind; throws a plain internal error only if a table it
 * built breaks its own invariants (a bug, never bad input).
 */
export function layoutWinding(spec: WindingSpec): WindingLayout {
  checkSpec(spec);
  const { style, slots: S, poles: P, span, coils_per_slot: u } = spec;
  const p = P / 2;
  const C = spec.bars;
  const t = style === "tooth" ? toothTable(spec) : style === "lap" ? lapTable(spec) : waveTable(spec);
  const { coils, notes, warnings, groups, paths, perAdjacent } = t;
  const yc = t.yc;
  const yb = t.yb;
  const yf = t.yf;

  // riding counts: coils laid later ride over the end turns of earlier coils whose slot arc they share
  // (the clockwise arc from go slot to return slot); tooth coils ride over none. Common practice, no published source.
  if (style !== "tooth") ridingCounts(coils, span, S);

  const pitch = S / P;
  if (style !== "tooth" && span < SHORT_SPAN_FRACTION * pitch) {
    warnings.push({
      code: "span_short",
      path: "winding.span",
      message: `span ${span} is less than half the pole pitch (${fmt(pitch)} slots): the coils link little flux (common practice); check the count on the old winding`,
    });
  }

  notes.push(...brushNotes(spec, coils, C, perAdjacent));

  const layout: WindingLayout = {
    spec,
    bars: C,
    pole_pairs: p,
    coils,
    paths,
    coil_sides_per_slot: style === "tooth" ? 2 : 2 * u,
    commutator_pitch: yc,
    back_pitch: yb,
    front_pitch: yf,
    pole_pitch_slots: pitch,
    equalizers: style === "lap" && p > 1 && spec.equalizers,
    equalizer_groups: groups,
    circuit_order: [],
    coils_between_adjacent_bars: perAdjacent,
    notes,
    warnings,
  };
  layout.circuit_order = circuitOrder(layout);
  const short = brushShortWarning(layout);
  if (short) warnings.push(short);
  const broken = checkInvariants(layout);
  if (broken.length) {
    throw new Error(`internal error: winding table breaks its invariants: ${broken.join("; ")}`);
  }
  if (style === "wave" && gcd(p, C) !== 1) {
    throw new Error(`internal error: simplex wave with gcd(p, C) = ${gcd(p, C)}`);
  }
  return layout;
}

/**
 * How many earlier coils each coil rides over: those whose clockwise slot arc (span slots from the
 * go slot) shares a slot with its own. Two arcs of `span` slots share one when their go slots are
 * fewer than `span` slots apart either way round, so each coil counts the earlier coils per go slot
 * in that window: O(C · span), not O(C² · span).
 */
function ridingCounts(coils: Coil[], span: number, S: number): void {
  const earlier = new Int32Array(S + 1);
  const offsets: number[] = [];
  if (span > 0) {
    if (2 * span - 1 >= S) for (let o = 0; o < S; o++) offsets.push(o);
    else for (let o = -(span - 1); o <= span - 1; o++) offsets.push(o);
  }
  for (const c of coils) {
    let n = 0;
    for (const o of offsets) n += earlier[mod1(c.go_slot + o, S)];
    c.rides_over = n;
    earlier[c.go_slot]++;
  }
}

/** Notes about brush width: which coils a brush shorts while they commutate, and what it does to the readings. */
function brushNotes(spec: WindingSpec, coils: Coil[], C: number, perAdjacent: number): string[] {
  const w = spec.brushes.width_bars;
  const maxBars = Math.min(C, Math.ceil(w) + 1);
  const out: string[] = [];
  if (w <= 1) {
    out.push(
      `Brushes ${fmt(w)} bar wide touch one or two bars: while a brush bridges two bars it shorts the coil${perAdjacent > 1 ? ` chain (${perAdjacent} coils in series)` : ""} joining them, the coil commutating (normal).`,
    );
    return out;
  }
  // coils with both ends on the bars under one brush spanning maxBars adjacent bars, relative to the first bar under it
  const base = 1;
  const under = new Set<number>();
  for (let i = 0; i < maxBars; i++) under.add(mod1(base + i, C));
  const rel: string[] = [];
  for (const c of coils) {
    if (c.dead || c.start_bar === null || c.end_bar === null) continue;
    if (under.has(c.start_bar) && under.has(c.end_bar)) {
      const off = (c.start_bar - base + C) % C;
      const offEnd = (c.end_bar - base + C) % C;
      rel.push(`from bar b+${off} to b+${offEnd}`);
    }
  }
  const which = rel.length
    ? `the coils ${rel.join(", ")} (b the first bar under the brush)`
    : `the chain of ${perAdjacent} coils in series between each pair of adjacent bars under the brush (no single coil has both ends under it)`;
  out.push(
    `Brushes ${fmt(w)} bars wide touch up to ${maxBars} adjacent bars at once and short ${which} while they commutate: those coils carry no load current, the terminal resistance drops at those rotor positions (see the minimum over a turn) and sparking may rise; bar-to-bar readings, taken with the brushes lifted, are not affected.`,
  );
  return out;
}

/** Follow the closed winding from coil 1: coil indices in the order the circuit passes them (live coils only). */
function circuitOrder(layout: WindingLayout): number[] {
  const byStart = new Map<number, Coil>();
  for (const c of layout.coils) if (!c.dead && c.start_bar !== null) byStart.set(c.start_bar, c);
  const order: number[] = [];
  let c = layout.coils[0];
  const seen = new Set<number>();
  while (c && !seen.has(c.index)) {
    seen.add(c.index);
    order.push(c.index);
    const next = c.end_bar === null ? undefined : byStart.get(c.end_bar);
    if (!next) break;
    c = next;
  }
  return order;
}

/**
 * The table's invariants; returns the broken ones as sentences (empty when all hold):
 *  - every coil side lies in exactly one slot position (slot, layer, position), each position in range
 *    and taken by one side only, each slot filled with its coil sides;
 *  - every bar takes exactly two coil ends (a dead coil takes none);
 *  - the winding closes on itself: following coils from bar to bar visits every live coil once and
 *    returns to bar 1.
 */
export function checkInvariants(layout: WindingLayout): string[] {
  const errs: string[] = [];
  const { spec, coils } = layout;
  const S = spec.slots;
  const C = layout.bars;
  const u = spec.style === "tooth" ? 1 : spec.coils_per_slot;
  const okLayers: Layer[] = spec.style === "tooth" ? ["left", "right"] : ["top", "bottom"];
  const taken = new Map<string, number>();
  const perSlot = new Array<number>(S + 1).fill(0);
  coils.forEach((c, i) => {
    if (c.index !== i + 1) errs.push(`coil at row ${i + 1} is numbered ${c.index}`);
    const sides: [number, Layer, number][] = [
      [c.go_slot, c.go_layer, c.go_position],
      [c.return_slot, c.return_layer, c.return_position],
    ];
    for (const [slot, layer, pos] of sides) {
      if (!Number.isInteger(slot) || slot < 1 || slot > S) errs.push(`coil ${c.index} has a side in slot ${slot}, outside 1…${S}`);
      if (!okLayers.includes(layer)) errs.push(`coil ${c.index} has a side in layer ${layer}`);
      if (!Number.isInteger(pos) || pos < 1 || pos > u) errs.push(`coil ${c.index} has a side at position ${pos}, outside 1…${u}`);
      const key = `${slot}/${layer}/${pos}`;
      if (taken.has(key)) errs.push(`coil ${c.index} and coil ${taken.get(key)} share slot ${slot} ${layer} position ${pos}`);
      else taken.set(key, c.index);
      if (slot >= 1 && slot <= S) perSlot[slot]++;
    }
    if (c.go_layer === c.return_layer) errs.push(`coil ${c.index} has both sides in the ${c.go_layer} layer`);
  });
  for (let s = 1; s <= S; s++) {
    if (perSlot[s] !== layout.coil_sides_per_slot) errs.push(`slot ${s} holds ${perSlot[s]} coil sides, not ${layout.coil_sides_per_slot}`);
  }
  // bars
  const ends = new Array<number>(C + 1).fill(0);
  let live = 0;
  for (const c of coils) {
    if (c.dead) {
      if (c.start_bar !== null || c.end_bar !== null) errs.push(`dead coil ${c.index} is connected to a bar`);
      continue;
    }
    live++;
    for (const b of [c.start_bar, c.end_bar]) {
      if (b === null || !Number.isInteger(b) || b < 1 || b > C) errs.push(`coil ${c.index} has an end on bar ${b}, outside 1…${C}`);
      else ends[b]++;
    }
  }
  for (let b = 1; b <= C; b++) if (ends[b] !== 2) errs.push(`bar ${b} takes ${ends[b]} coil ends, not 2`);
  // closure
  const first = coils[0];
  if (!first || first.dead || first.start_bar !== 1) errs.push("coil 1 does not start at bar 1");
  const starts = new Map<number, Coil>();
  for (const c of coils) {
    if (c.dead || c.start_bar === null) continue;
    if (starts.has(c.start_bar)) errs.push(`coils ${starts.get(c.start_bar)!.index} and ${c.index} both start at bar ${c.start_bar}`);
    starts.set(c.start_bar, c);
  }
  if (first && !first.dead && errs.length === 0) {
    const seen = new Set<number>();
    let c: Coil | undefined = first;
    let steps = 0;
    while (c && steps <= live) {
      if (seen.has(c.index)) break;
      seen.add(c.index);
      steps++;
      c = c.end_bar === null ? undefined : starts.get(c.end_bar);
    }
    if (seen.size !== live) errs.push(`following the coils from bar 1 passes ${seen.size} of ${live} live coils before it ${c ? "closes" : "stops"}`);
    else if (c !== first) errs.push("the winding does not return to coil 1");
  }
  return errs;
}

/** Angle (rad, clockwise from the centre of slot 1, seen from the commutator end) of the centre of slot `slot`: (slot − 1)·2π/S. */
export function slotAngle(layout: WindingLayout, slot: number): number {
  const S = layout.spec.slots;
  return norm(((slot - 1) * 2 * Math.PI) / S);
}

/**
 * The viewing convention in one sentence, for wherever coils are drawn or listed (docs/contracts.md
 * "Numbering and directions").
 */
export function viewingConvention(layout: WindingLayout): string {
  const base = "Slots and bars are numbered clockwise as seen from the commutator end.";
  if (layout.spec.style !== "tooth") return `${base} Each coil goes into its first slot and returns through the second; the slots fix its sense.`;
  return `${base} Cw and ccw are the sense round the tooth seen from outside, looking at the tooth tip with the commutator end at the top (slot k+1 then lies to the left of slot k): cw goes into slot k and back through slot k+1, ccw into slot k+1 and back through slot k.`;
}

/**
 * Angle (rad, clockwise from the centre of slot 1, seen from the commutator end) of the centre of
 * bar `bar`. Bar 1 sits `lead_throw` bars clockwise from the bar on coil 1's centre line (midway
 * between its go and return slots, span·π/S); bars follow clockwise at 2π/C each (docs/contracts.md
 * "Numbering and directions"). The lead throw moves the bars on the drawing, never the bar numbers.
 */
export function barAngle(layout: WindingLayout, bar: number): number {
  const S = layout.spec.slots;
  const C = layout.bars;
  const c1 = layout.coils[0];
  const gap = layout.spec.style === "tooth" ? 1 : (c1.return_slot - c1.go_slot + S) % S; // span (tooth: 1, whichever sense)
  const centre = (gap * Math.PI) / S;
  return norm(centre + ((layout.spec.lead_throw + bar - 1) * 2 * Math.PI) / C);
}

/** Angles (rad, clockwise from slot 1's centre, seen from the commutator end) of every slot and bar, index 0 = slot/bar 1, for drawing. */
export function diagramAngles(layout: WindingLayout): { slot_angle_rad: number[]; bar_angle_rad: number[] } {
  const slots: number[] = [];
  for (let s = 1; s <= layout.spec.slots; s++) slots.push(slotAngle(layout, s));
  const bars: number[] = [];
  for (let b = 1; b <= layout.bars; b++) bars.push(barAngle(layout, b));
  return { slot_angle_rad: slots, bar_angle_rad: bars };
}

function norm(a: number): number {
  const t = 2 * Math.PI;
  const r = a % t;
  return r < 0 ? r + t : r;
}
