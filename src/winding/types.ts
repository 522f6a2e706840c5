/** Types of the winding layout: coil tables, numbering as docs/contracts.md fixes it. */
import type { Warning } from "../errors.js";

import type { Progression, Sense, WindingStyle } from "../job/schema.js";

export type { Progression, Sense, WindingStyle };

export interface WindingSpec {
  style: WindingStyle;
  slots: number;
  bars: number;
  /** Field poles P (2, 4, 6 …). */
  poles: number;
  /** Coil span in slots (tooth: 1). */
  span: number;
  coils_per_slot: number;
  dead_coil: boolean;
  equalizers: boolean;
  progression: Progression;
  lead_throw: number;
  direction: Sense;
  brushes: { count: number; width_bars: number };
}

/** Layer names: two-layer lap and wave windings use top/bottom; tooth windings the two halves of a slot. */
export type Layer = "top" | "bottom" | "left" | "right";

export interface Coil {
  /** Coil number, 1-based, in winding order (wave: circuit order; a dead coil last). */
  index: number;
  go_slot: number;
  return_slot: number;
  /**
   * Layer of the go side: "top" / "bottom" for two-layer lap and wave windings (go side top,
   * return side bottom); for tooth windings the half of the slot: "right" is the clockwise half
   * seen from the commutator end (coil k's side in slot k: its go side for cw, its return side
   * for ccw), "left" the anticlockwise half (coil k's side in slot k+1). The JSON `layer` of
   * docs/contracts.md is `go_layer`.
   */
  go_layer: Layer;
  return_layer: Layer;
  /** Position within the slot's layer when u > 1 (1 … u), 1 otherwise. */
  go_position: number;
  return_position: number;
  start_bar: number | null;
  end_bar: number | null;
  /** Tooth windings: sense round the tooth; lap/wave: null (slots fix it). */
  direction: Sense | null;
  dead: boolean;
  /** How many coils were laid before this one whose end turns it rides over (0 for the first, or for tooth coils that overlap nothing). */
  rides_over: number;
}

export interface WindingLayout {
  spec: WindingSpec;
  /** Commutator bars C (as the spec gives them). */
  bars: number;
  /** Pole pairs p = P/2. */
  pole_pairs: number;
  coils: Coil[];
  /** Parallel paths a between the brushes (lap: P, wave: 2, tooth: 2). */
  paths: number;
  /** Coil sides in one slot: tooth 2, lap/wave 2·u. */
  coil_sides_per_slot: number;
  /**
   * Commutator pitch y_c in bars, textbook sign: lap +1 progressive, −1 retrogressive;
   * wave (C+1)/p or (C−1)/p; tooth +1.
   */
  commutator_pitch: number;
  /**
   * Back and front pitch in coil sides, textbook convention (conductors numbered round the
   * armature, top layer odd, bottom layer even), both given as positive counts: lap
   * y_b − y_f = +2 progressive, −2 retrogressive; wave y_b + y_f = 2·y_c. Null for tooth.
   */
  back_pitch: number | null;
  front_pitch: number | null;
  /** Pole pitch in slots, S/P. */
  pole_pitch_slots: number;
  /** Equalizer connections fitted (lap, P > 2, as the spec says). */
  equalizers: boolean;
  /** Where equalizer connections go (lap, P > 2), as bar groups at potential-equal points; [] otherwise. */
  equalizer_groups: number[][];
  /**
   * Live coil indices in the order the closed winding passes them, starting with coil 1
   * (lap progressive 1, 2, 3 …; lap retrogressive 1, C, C−1 …; wave 1, 2, 3 …).
   */
  circuit_order: number[];
  /** Coils in series between two adjacent bars: 1 for tooth and lap, p for a simplex wave. */
  coils_between_adjacent_bars: number;
  /** Plain sentences for the card and the plan (brush shorting, equalizers, dead coil …). */
  notes: string[];
  warnings: Warning[];
}
