/**
 * A series (universal) motor's figures in words, the same on the terminal and the card: the rows of
 * the motor table, original and new side by side (k, the supply, the rated-load point, the
 * locked-rotor current at the reduced check voltage, the field), "—" where the job lacks the data.
 * Never a stall figure at the supply: the locked rotor is checked only at the reduced voltage.
 */
import type { Plan } from "../design/types.js";
import type { SeriesFigure } from "../design/series.js";
import { pct, rpm, sig } from "./number.js";

type SeriesPlan = NonNullable<Plan["series"]>;

/** "230 V 50 Hz AC" or "12 V DC". */
export function supplyText(s: { volts: number; frequency: number }): string {
  const plain = (x: number) => String(Number(x.toPrecision(4)));
  return s.frequency > 0 ? `${plain(s.volts)} V ${plain(s.frequency)} Hz AC` : `${plain(s.volts)} V DC`;
}

/** Rows [label, original, new] of the motor table for a series motor; torque (N·m → text) in the table's unit. */
export function seriesMotorRows(sp: SeriesPlan, torque: (nm: number | null) => string, torqueUnit: string): string[][] {
  const o = sp.original;
  const n = sp.rewound;
  const at = (p: SeriesFigure | null, f: (p: SeriesFigure) => string) => (p ? f(p) : "—");
  const rated = sp.ratedTorque === null ? "rated load (not known)" : `at rated load ${torque(sp.ratedTorque)} ${torqueUnit}`;
  const rows: string[][] = [
    ["k (series field), mV·s/(A·rad)", o.k === null ? "—" : sig(o.k * 1e3), n.k === null ? "—" : sig(n.k * 1e3)],
    ["supply", supplyText(sp.originalSupply), supplyText(sp.supply)],
    [`${rated}: speed, rpm`, at(o.rated, (p) => rpm(p.speed)), at(n.rated, (p) => rpm(p.speed))],
    ["   current, A", at(o.rated, (p) => sig(p.current)), at(n.rated, (p) => sig(p.current))],
    ["   input, W", at(o.rated, (p) => sig(p.inputW)), at(n.rated, (p) => sig(p.inputW))],
    ["   efficiency", at(o.rated, (p) => pct(p.efficiency)), at(n.rated, (p) => pct(p.efficiency))],
    [
      sp.lockedRotor ? `locked rotor at ${supplyText(sp.lockedRotor.supply)}, cold, A` : "locked rotor at reduced voltage, A",
      o.lockedRotorCurrent === null ? "—" : sig(o.lockedRotorCurrent),
      n.lockedRotorCurrent === null ? "—" : sig(n.lockedRotorCurrent),
    ],
    ["field resistance at 20 °C, Ω", sig(o.fieldOhm), sig(n.fieldOhm)],
  ];
  if (sp.convert) {
    const c = sp.convert;
    rows.push([
      "field for the new supply",
      "",
      `${c.fieldTurnsPerPole === null ? `turns × ${sig(c.ratio)}` : `${c.fieldTurnsPerPole} turns a pole`}, copper area × ${sig(c.fieldAreaFactor)}`,
    ]);
  }
  return rows;
}
