/**
 * The bench sheet: the expected bar-to-bar reading of every pair with its window and a blank for
 * the reading, then the checks before varnish (terminal resistance, ground, growler, polarity) and
 * the run after varnish (bar to bar again, no-load, brief stall; a series motor's own), each group
 * with its sign-off. The rules and windows are the ones `log` and `diagnose` apply
 * (src/bench/rules.ts).
 */
import type { Plan } from "../../design/types.js";
import type { Sheet, TextBlock } from "../sheet.js";
import { pageBreaks } from "../layout.js";
import { ohm, rpm, sig } from "../text.js";
import { hasShuntField } from "../../format/shunt.js";
import { fieldCurrent } from "../../motor/model.js";
import { seriesBenchChecks } from "./series.js";
import {
  NULL_LEADS,
  SPREAD,
  fourWireAdvice,
  levelBounds,
  levelRuleText,
  turnLengthCalibrated,
  levelWindow,
  median,
  meterResolution,
  meterText,
  needsFourWire as needsFourWireRule,
  spreadRuleText,
} from "../../bench/rules.js";

/** A plain number without padding zeros (5, 0.01, 10) for rules and limits. */
const plain = (x: number) => String(Number(x.toPrecision(4)));

/** True when a reading this small needs a four-wire / millivolt-drop method (the bench rules' test; kept here for callers of the card). */
export function needsFourWire(expectedOhm: number, resolutionOhm: number): boolean {
  return needsFourWireRule(expectedOhm, resolutionOhm);
}

export function benchPage(s: Sheet, plan: Plan): void {
  s.startSection("Bench checks", { share: 0.45 });
  headerBlanks(s);
  barToBar(s, plan);
  checkGroup(s, "2. Before varnish", beforeVarnish(plan), "all pass: varnish");
  checkGroup(s, "3. After varnish, cure, skim and balance: the run", theRun(plan), "result");
}

/** Date, winder and winding temperature, to fill in first. */
function headerBlanks(s: Sheet): void {
  s.need(60);
  const y0 = s.y;
  s.blank(s.left, y0, 150, "date");
  s.blank(s.left + 165, y0, 190, "winder");
  s.blank(s.left + 370, y0, s.width - 370, "winding temperature", "°C");
  s.y += s.L.blank.height + 10;
}

/** The level window (fraction) and its reading as "low–high" Ω for an expected reading, as the bench rules give them for this plan and meter. */
interface Windows {
  level: number;
  text: (expectedOhm: number) => string;
}

/**
 * Section 1, bar to bar: the rules in the words `log` and `diagnose` use, the four-wire advice for
 * this meter (or "null the leads"), the table of readings, and the median line.
 */
function barToBar(s: Sheet, plan: Plan): void {
  const T = s.L.type;
  const r = plan.resistance;
  const C = plan.layout.bars;
  s.subheading("1. Bar to bar, brushes lifted", `expected at 20 °C; r_i is bar i to bar i+1, r${C} bar ${C} to bar 1`);
  // the rules `log` and `diagnose` apply, in their words (src/bench/rules.ts)
  const tol = SPREAD.fraction;
  const meter = s.context.meter ?? meterResolution({});
  const res = meter.ohm;
  const calibrated = turnLengthCalibrated(plan.wire.mlt_source);
  const expectedMedian = median(r.bar_to_bar);
  const level = levelWindow(calibrated, plan.design.wire.bare_diameter, res, expectedMedian);
  const windows: Windows = {
    level,
    text: (v) => {
      const b = levelBounds(v, level);
      return `${ohm(b.low)}–${ohm(b.high)}`;
    },
  };
  s.para(
    `${spreadRuleText()} ${levelRuleText(level, calibrated)} Windows worked out for ${meterText(meter)}. ` +
      `Correct a reading taken at t °C to 20 °C by dividing it by 1 + 0.00393 × (t − 20) (IEC 60028 copper).`,
    { size: T.body },
  );
  const advice = fourWireAdvice(Math.min(...r.bar_to_bar), res);
  s.framed((x, y, w) => s.at(advice ? `${advice} ${NULL_LEADS}` : NULL_LEADS, x, y, { size: T.body, bold: true, width: w }), {
    heavy: advice !== null,
    estimate: advice ? 40 : 14,
  });
  readingsTable(s, plan, windows);
  s.para(
    `Median of the expected readings: ${ohm(expectedMedian)} Ω; your median within ${windows.text(expectedMedian)} Ω. Median of your readings: ________ Ω; each reading within ±${plain(tol * 100)} % of it (your median × ${plain(1 - tol)} to × ${plain(1 + tol)}), widened by one count of the meter.`,
    { size: T.body },
  );
}

/**
 * The readings table r1 … rC: pair, bars, expected, window (in the same size as the expected
 * value: it is the number the winder compares with) and a line to write on. Two sets of columns
 * side by side when the widest window fits its column, else one; it breaks across pages,
 * repeating its header.
 */
function readingsTable(s: Sheet, plan: Plan, windows: Windows): void {
  const T = s.L.type;
  const B = s.L.bench;
  const C = plan.layout.bars;
  const widest = Math.max(...plan.resistance.bar_to_bar.map((v) => s.widthOf(windows.text(v), { size: T.table + 1, bold: true })));
  const fits = (n: number) => ((s.width - (n - 1) * 12) / n) * 0.29 - 4 >= widest;
  const sets = Math.max(1, B.column_sets) > 1 && fits(Math.max(1, B.column_sets)) ? Math.max(1, B.column_sets) : 1;
  const setW = (s.width - (sets - 1) * 12) / sets;
  const cols = [0.09, 0.15, 0.23, 0.29, 0.24].map((f) => f * setW);
  const rows = plan.resistance.bar_to_bar.map((v, i) => ({ i: i + 1, bars: `${i + 1}–${i + 2 > C ? 1 : i + 2}`, v }));
  const rh = B.row_height;
  const header = (y: number) => {
    for (let k = 0; k < sets; k++) {
      const x = s.left + k * (setW + 12);
      s.doc.save().rect(x, y, setW, 15).fill("#e6e6e6").restore();
      let cx = x + 3;
      ["pair", "bars", "expected Ω", "window Ω", "reading Ω"].forEach((h, j) => {
        s.at(h, cx, y + 3.5, { size: T.small, bold: true });
        cx += cols[j];
      });
    }
  };
  const row = (x: number, y: number, r: (typeof rows)[number]) => {
    const texts: [string, number, boolean, number][] = [
      [`r${r.i}`, T.table, true, 5],
      [r.bars, T.table, false, 5],
      [ohm(r.v), T.table + 1, true, 4],
      [windows.text(r.v), T.table + 1, true, 4],
    ];
    let cx = x + 3;
    texts.forEach(([text, size, bold, dy], j) => {
      s.at(text, cx, y + dy, { size, bold });
      cx += cols[j];
    });
    s.doc
      .save()
      .lineWidth(0.6)
      .moveTo(cx, y + rh - 2)
      .lineTo(x + setW - 4, y + rh - 2)
      .stroke()
      .restore();
  };
  let idx = 0;
  while (idx < rows.length) {
    s.need(15 + rh * Math.min(3, rows.length - idx));
    const perCol = Math.max(1, Math.min(Math.floor((s.bottom - s.y - 15) / rh), Math.ceil((rows.length - idx) / sets)));
    header(s.y);
    const yStart = s.y + 16;
    for (let k = 0; k < sets && idx < rows.length; k++)
      for (let j = 0; j < perCol && idx < rows.length; j++, idx++) row(s.left + k * (setW + 12), yStart + j * rh, rows[idx]);
    s.y = yStart + perCol * rh + 6;
  }
}

/** A check: its title, what to do, and the blanks to fill in (label, unit, width in pt). */
type Check = [title: string, body: string, blanks: [string, string, number][]];
/** A check with its body laid out once. */
type Laid = [title: string, body: TextBlock, blanks: [string, string, number][]];

/** Height a laid-out check takes, pt: title, body, and a row of blanks when it has any. */
function checkHeight(s: Sheet, [, body, blanks]: Laid): number {
  return s.L.type.subheading * 1.5 + body.height + 4 + (blanks.length ? s.L.blank.height + 10 : 4);
}

/** Draw one check at the running y: a tick box, its title, its body and its blanks. */
function drawCheck(s: Sheet, [title, body, blanks]: Laid): void {
  const T = s.L.type;
  s.tickBox(s.left, s.y + 1, s.L.tick_box, true);
  s.at(title, s.left + 24, s.y + 2, { size: T.subheading, bold: true });
  s.y += T.subheading * 1.5;
  s.draw(body, s.left + 24, s.y);
  s.y += body.height + 4;
  let x = s.left + 24;
  for (const [label, unit, w] of blanks) {
    s.blank(x, s.y, w, label, unit);
    x += w + 14;
  }
  s.y += blanks.length ? s.L.blank.height + 10 : 4;
}

/** Height of a group's sign-off line, pt. */
const signOffHeight = (s: Sheet) => s.L.blank.height + 14;

/** The sign-off under a group: what passed, checked by, date. */
function signOff(s: Sheet, what: string): void {
  s.y += 6;
  const ys = s.y;
  s.blank(s.left, ys, 200, what, "");
  s.blank(s.left + 215, ys, 150, "checked by", "");
  s.blank(s.left + 380, ys, s.width - 380, "date", "");
  s.y += s.L.blank.height + 8;
}

/**
 * A group of checks under its subheading, closed by its sign-off. It starts below what comes
 * before when the subheading and its first two checks fit there; it breaks only between checks,
 * never leaving one check alone on a page, and its last check stays with the sign-off (layout.ts
 * `pageBreaks`).
 */
function checkGroup(s: Sheet, heading: string, written: Check[], sign: string): void {
  const T = s.L.type;
  const checks = written.map(([title, body, blanks]): Laid => [title, s.layout(body, { size: T.body, width: s.width - 24 }), blanks]);
  // the sign-off travels with the last check
  const heights = checks.map((c, i) => checkHeight(s, c) + (i === checks.length - 1 ? signOffHeight(s) : 0));
  const subheading = T.subheading * 1.65 + 40; // what `subheading` asks room for besides its check
  s.need(subheading + heights.slice(0, 2).reduce((a, b) => a + b, 0));
  s.subheading(heading);
  const breaks = new Set(pageBreaks(heights, s.room(), s.fullRoom()));
  checks.forEach((c, i) => {
    if (breaks.has(i)) s.need(s.bottom);
    drawCheck(s, c);
  });
  signOff(s, sign);
}

/** The checks before varnish: terminal resistance, ground, growler, polarity. */
function beforeVarnish(plan: Plan): Check[] {
  const r = plan.resistance;
  const C = plan.layout.bars;
  return [
    [
      "Terminal resistance",
      `Across the brushes (or bars ${1} and ${1 + Math.floor(C / 2)}): expected ${ohm(r.terminal_ohm)} Ω at 20 °C, ${r.terminal_min_ohm === null ? `up to ${ohm(r.terminal_max_ohm)} Ω as the rotor turns (no least reading: at some position a + and a − brush touch the same bar and short the supply; read with each brush on one bar)` : `between ${ohm(r.terminal_min_ohm)} and ${ohm(r.terminal_max_ohm)} Ω as the rotor turns`}; ${ohm(r.terminal_hot_ohm)} Ω at ${sig(r.hot_temperature)} °C.`,
      [
        ["reading", "Ω", 150],
        ["at", "°C", 90],
      ],
    ],
    [
      "Ground (insulation) check",
      `Every bar to the shaft and to the core: no continuity. Test with an insulation tester at the voltage the standard your shop follows sets (e.g. IEC 60034-1); this card does not set a test voltage. Trained people only (see Cautions).`,
      [
        ["test voltage", "V", 130],
        ["insulation", "MΩ", 140],
        ["pass / fail", "", 110],
      ],
    ],
    [
      "Growler (shorted turns)",
      `Turn the armature in the growler with a hacksaw blade held over each slot: the blade buzzes over a coil with shorted turns (common practice).`,
      [["result", "", 260]],
    ],
    [
      "Polarity (reversed coil, wrong lead throw)",
      `A reversed coil or a wrong lead throw still reads normal bar to bar. Feed a low DC current between two bars (or use the growler) and run a compass along the slots: the needle must reverse evenly, pole by pole, with no coil out of step (common practice).`,
      [["result", "", 260]],
    ],
  ];
}

/**
 * For a shunt motor of known field: the stall figures are the armature's, so say where the ammeter
 * goes, and what the field adds in the supply lead (I_f = V/R_f, src/motor/model.ts `fieldCurrent`).
 */
function shuntStallNote(plan: Plan): string {
  if (!hasShuntField(plan)) return "";
  const rf = plan.calibration.shunt_field_ohm!;
  return ` These figures are the armature's current: put the ammeter in the armature lead. With the field across the same supply, an ammeter in the supply lead reads the field's V ÷ ${ohm(rf)} Ω besides (${sig(fieldCurrent(rf, plan.supply))} A at ${sig(plan.supply)} V, cold).`;
}

/** The run after varnish: bar to bar again, then the no-load runs and a brief stall (a series motor: its own checks, card/pages/series.ts). */
function theRun(plan: Plan): Check[] {
  const r = plan.resistance;
  const C = plan.layout.bars;
  const tol = SPREAD.fraction;
  const m = plan.motor;
  const run: Check[] = [
    [
      "Bar to bar again, after skimming and undercutting",
      `Skimming and undercutting can leave copper between bars: read r1 … r${C} again; each within ±${plain(tol * 100)} % of your median.`,
      [
        ["median", "Ω", 150],
        ["all within", "", 120],
      ],
    ],
  ];
  if (plan.job.armature.field === "series") {
    // series motors: load run, no-load run only where the cautions allow, locked rotor at a reduced voltage (card/pages/series.ts)
    for (const c of seriesBenchChecks(plan)) run.push([c.title, c.body, c.blanks]);
  } else {
    run.push([
      "No-load current and speed",
      `At ${sig(plan.supply)} V ${plan.supply_kind.toUpperCase()}, motor assembled and balanced, no load: expected ${sig(m.noLoadCurrent)} A and ${rpm(m.noLoadSpeed)} rpm. Guard the shaft.`,
      [
        ["supply", "V", 100],
        ["current", "A", 110],
        ["speed", "rpm", 130],
      ],
    ]);
    if ((plan.job.original.tests ?? []).filter((t) => (t as { kind?: string }).kind !== "load").length < 2) {
      run.push([
        "Second no-load run, at about half the supply",
        `At about ${sig(plan.supply / 2)} V: current and speed. With one no-load test the loss torque is held constant; two at different speeds give the part that grows with speed, so the next plan of this armature predicts idle current better (log them with the rewind).`,
        [
          ["supply", "V", 100],
          ["current", "A", 110],
          ["speed", "rpm", 130],
        ],
      ]);
    }
    run.push([
      "Brief stall current",
      plan.mains
        ? `Seconds only, rotor held safely (see Cautions), at a reduced DC supply only — never at ${sig(plan.supply)} V mains. At a reduced supply V the cold stall current is about (V − ${sig(plan.calibration.brush_drop)} V brush drop) ÷ ${ohm(r.terminal_ohm)} Ω.`
        : `Seconds only, rotor held safely (see Cautions). Expected at ${sig(plan.supply)} V: ${sig(m.stallCurrentCold)} A cold, ${sig(m.stallCurrent)} A hot. At a reduced supply V the cold stall current is about (V − ${sig(plan.calibration.brush_drop)} V brush drop) ÷ ${ohm(r.terminal_ohm)} Ω.${shuntStallNote(plan)}`,
      [
        ["supply", "V", 100],
        ["current", "A", 110],
      ],
    ]);
  }
  return run;
}
