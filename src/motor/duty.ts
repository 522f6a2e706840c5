/**
 * The duty point: where the motor runs when it drives a load of known torque.
 */
import { currentDensity } from "./density.js";
import { atTorque, type MotorModel } from "./model.js";

export interface DutyPoint {
  /** Speed at the load torque, rad/s. */
  speed: number;
  /** Armature current, A. */
  current: number;
  /** Shaft output / electrical input, 0 … 1. */
  efficiency: number;
  /** V·I, W. */
  inputW: number;
  /** Shaft power, W. */
  outputW: number;
  /** In each strand, A/m², when the wire is given; else null. */
  currentDensity: number | null;
}

/**
 * Operating point at load torque `torque` (N·m) and supply V (V), with the current density in
 * each strand when `wire` { paths, strands, strandArea m² } is given. Use the hot resistance in
 * the model. A torque beyond stall throws `beyond_stall` at `target.duty.torque`.
 * Source: the linear motor model (`atTorque`) and J = I/(a·k·A).
 */
export function dutyPoint(model: MotorModel, V: number, torque: number, wire?: { paths: number; strands: number; strandArea: number }): DutyPoint {
  const p = atTorque(model, V, torque, "target.duty.torque");
  return {
    speed: p.speed,
    current: p.current,
    efficiency: p.efficiency,
    inputW: p.inputW,
    outputW: p.outputW,
    currentDensity: wire ? currentDensity(p.current, wire.paths, wire.strands, wire.strandArea) : null,
  };
}
