/**
 * The goal in words, for the terminal and the card (the same sentence on both): how close the
 * chosen winding comes, in the goal's unit, with the tolerance as it was given.
 */
import type { GoalReport } from "../design/types.js";
import { pctGiven, signedPct } from "./number.js";
import { GOAL_UNIT, goalValue } from "./units.js";

/**
 * A tolerance as written: a bare t is ±t (a `stall_current` limit: −t, never above); `{ below, above }`
 * is −below/+above, a side of 0 "never above" or "never below".
 */
export function toleranceText(kind: GoalReport["kind"], tol: number | { below: number; above: number }): string {
  if (typeof tol === "number") return kind === "stall_current" ? `−${pctGiven(tol)} %, never above` : `±${pctGiven(tol)} %`;
  if (tol.below === tol.above) return `±${pctGiven(tol.below)} %`;
  if (tol.above === 0) return `−${pctGiven(tol.below)} %, never above`;
  if (tol.below === 0) return `+${pctGiven(tol.above)} %, never below`;
  return `−${pctGiven(tol.below)} %/+${pctGiven(tol.above)} %`;
}

/** Figures above 100 to whole units, others to 3 significant figures. */
function fig(x: number): string {
  return Math.abs(x) >= 100 ? x.toFixed(0) : x.toPrecision(3);
}

/** "1408 rpm/V against 1400 rpm/V (+0.6 %, tolerance ±4 %)", from the plan's SI goal. */
export function goalSummary(goal: GoalReport): string {
  const unit = GOAL_UNIT[goal.kind];
  const target = goalValue(goal.kind, goal.target)!;
  const achieved = goalValue(goal.kind, goal.achieved);
  const err = goal.error_fraction;
  if (achieved === null || err === null) return `the ${goal.kind.replace(/_/g, " ")} cannot be predicted: nothing calibrates the motor`;
  const signed = signedPct(err, 1);
  if (goal.fixed) {
    const f = goal.fixed;
    return `the winding chosen: ${f.turns} turns of ${f.wire}${f.strands > 1 ? `, ${f.strands} in hand` : ""} (copper area ${fig(achieved)} mm²)`;
  }
  if (goal.kind === "restore") return `copper area ${fig(achieved)} mm² against the original's ${fig(target)} mm² (${signed})`;
  if (goal.kind === "convert")
    return `${fig(achieved)} rpm at the original's rated torque on the new supply against its ${fig(target)} rpm (${signed}, tolerance ${toleranceText(goal.kind, goal.tolerance)})`;
  const atMost = goal.kind === "stall_current" ? "at most " : "";
  return `${fig(achieved)} ${unit} against ${atMost}${fig(target)} ${unit} (${signed}, tolerance ${toleranceText(goal.kind, goal.tolerance)})`;
}
