/** Types of the winding layout: coil tables, numbering as DESIGN.md fixes it. */
import type { Warning } from "../errors.js";

export type WindingStyle = "tooth" | "lap" | "wave";
export type Progression = "progressive" | "retrogressive";
export type Sense = "cw" | "ccw";

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

export interface Coil {
  /** Coil number, 1-based, in winding order (wave: circuit order; a dead coil last). */
  index: number;
  go_slot: number;
  return_slot: number;
  /** Layer of the go side: "top" / "bottom" for two-layer lap and wave windings, "left"/"right" half of the slot for tooth windings. */
  go_layer: string;
  return_layer: string;
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
  coils: Coil[];
  /** Parallel paths a between the brushes (lap: P, wave: 2, tooth: 2). */
  paths: number;
  /** Coil sides in one slot: tooth 2, lap/wave 2·u. */
  coil_sides_per_slot: number;
  /** Commutator pitch y_c in bars. */
  commutator_pitch: number;
  /** Back and front pitch in coil sides, textbook convention (for lap/wave; null for tooth). */
  back_pitch: number | null;
  front_pitch: number | null;
  /** Pole pitch in slots, S/P. */
  pole_pitch_slots: number;
  /** Where equalizer connections go (lap, P > 2), as bar groups at potential-equal points; [] otherwise. */
  equalizer_groups: number[][];
  /** Plain sentences for the card and the plan (brush shorting, equalizers, dead coil …). */
  notes: string[];
  warnings: Warning[];
}
