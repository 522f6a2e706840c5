/**
 * Page 4, bench checks: the expected bar-to-bar reading of every pair with its tolerance and a
 * blank for the reading, terminal resistance, ground, growler, polarity, no-load and brief stall
 * checks, and the sign-off blanks.
 */
import type { Plan } from "../../design/types.js";
import type { Sheet, TextBlock } from "../sheet.js";
import { ohm, rpm, sig } from "../text.js";
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
  const T = s.L.type;
  const B = s.L.bench;
  const r = plan.resistance;
  const C = plan.layout.bars;
  s.startSection("Bench checks", { share: 0.45 });
  s.need(60);
  const y0 = s.y;
  s.blank(s.left, y0, 150, "date");
  s.blank(s.left + 165, y0, 190, "winder");
  s.blank(s.left + 370, y0, s.width - 370, "winding temperature", "°C");
  s.y += s.L.blank.height + 10;

  s.subheading("1. Bar to bar, brushes lifted", `expected at 20 °C; r_i is bar i to bar i+1, r${C} bar ${C} to bar 1`);
  // the rules `log` and `diagnose` apply, in their words (src/bench/rules.ts)
  const tol = SPREAD.fraction;
  const meter = s.context.meter ?? meterResolution({});
  const res = meter.ohm;
  const calibrated = turnLengthCalibrated(plan.wire.mlt_source);
  const expectedMedian = median(r.bar_to_bar);
  const level = levelWindow(calibrated, plan.design.wire.bare_diameter, res, expectedMedian);
  s.para(
    `${spreadRuleText()} ${levelRuleText(level, calibrated)} Windows worked out for ${meterText(meter)}. ` +
      `Correct a reading taken at t °C to 20 °C by dividing it by 1 + 0.00393 × (t − 20) (IEC 60028 copper).`,
    { size: T.body },
  );
  const minExpected = Math.min(...r.bar_to_bar);
  const advice = fourWireAdvice(minExpected, res);
  s.framed(
    (x, y, w) => {
      const text = advice ? `${advice} ${NULL_LEADS}` : NULL_LEADS;
      return s.at(text, x, y, { size: T.body, bold: true, width: w });
    },
    { heavy: advice !== null, estimate: advice ? 40 : 14 },
  );
  // two sets of columns side by side when the widest window fits its column, else one
  const windowText = (v: number) => {
    const b = levelBounds(v, level);
    return `${ohm(b.low)}–${ohm(b.high)}`;
  };
  const widest = Math.max(...r.bar_to_bar.map((v) => s.widthOf(windowText(v), { size: T.table + 1, bold: true })));
  const fits = (n: number) => ((s.width - (n - 1) * 12) / n) * 0.29 - 4 >= widest;
  const sets = Math.max(1, B.column_sets) > 1 && fits(Math.max(1, B.column_sets)) ? Math.max(1, B.column_sets) : 1;
  const setW = (s.width - (sets - 1) * 12) / sets;
  const cols = [0.11, 0.15, 0.21, 0.29, 0.24].map((f) => f * setW);
  const rows = r.bar_to_bar.map((v, i) => ({ i: i + 1, bars: `${i + 1}–${i + 2 > C ? 1 : i + 2}`, v }));
  const rh = B.row_height;
  const header = (y: number) => {
    for (let k = 0; k < sets; k++) {
      const x = s.left + k * (setW + 12);
      s.doc.save().rect(x, y, setW, 15).fill("#e6e6e6").restore();
      const heads = ["pair", "bars", "expected Ω", "window Ω", "reading Ω"];
      let cx = x + 3;
      heads.forEach((h, j) => {
        s.at(h, cx, y + 3.5, { size: T.small, bold: true });
        cx += cols[j];
      });
    }
  };
  let idx = 0;
  while (idx < rows.length) {
    s.need(15 + rh * Math.min(3, rows.length - idx));
    const perCol = Math.max(1, Math.min(Math.floor((s.bottom - s.y - 15) / rh), Math.ceil((rows.length - idx) / sets)));
    header(s.y);
    const yStart = s.y + 16;
    for (let k = 0; k < sets && idx < rows.length; k++) {
      const x = s.left + k * (setW + 12);
      for (let j = 0; j < perCol && idx < rows.length; j++, idx++) {
        const row = rows[idx];
        const y = yStart + j * rh;
        let cx = x + 3;
        s.at(`r${row.i}`, cx, y + 5, { size: T.table, bold: true });
        cx += cols[0];
        s.at(row.bars, cx, y + 5, { size: T.table });
        cx += cols[1];
        // the window in the same size as the expected value: it is the number the winder compares with
        s.at(ohm(row.v), cx, y + 4, { size: T.table + 1, bold: true });
        cx += cols[2];
        s.at(windowText(row.v), cx, y + 4, { size: T.table + 1, bold: true });
        cx += cols[3];
        s.doc
          .save()
          .lineWidth(0.6)
          .moveTo(cx, y + rh - 2)
          .lineTo(x + setW - 4, y + rh - 2)
          .stroke()
          .restore();
      }
    }
    s.y = yStart + perCol * rh + 6;
  }
  s.para(
    `Median of the expected readings: ${ohm(expectedMedian)} Ω; your median within ${windowText(expectedMedian)} Ω. Median of your readings: ________ Ω; each reading within ±${plain(tol * 100)} % of it (your median × ${plain(1 - tol)} to × ${plain(1 + tol)}), widened by one count of the meter.`,
    { size: T.body },
  );

  // each group of checks is measured whole and kept together with its heading and its sign-off
  type Check = [title: string, body: string, blanks: [string, string, number][]];
  type Laid = [title: string, body: TextBlock, blanks: [string, string, number][]];
  const checkHeight = ([, body, blanks]: Laid) => T.subheading * 1.5 + body.height + 4 + (blanks.length ? s.L.blank.height + 10 : 4);
  const check = ([title, body, blanks]: Laid) => {
    s.need(checkHeight([title, body, blanks]));
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
    if (blanks.length) s.y += s.L.blank.height + 10;
    else s.y += 4;
  };
  const signOff = (what: string) => {
    s.y += 6;
    const ys = s.y;
    s.blank(s.left, ys, 200, what, "");
    s.blank(s.left + 215, ys, 150, "checked by", "");
    s.blank(s.left + 380, ys, s.width - 380, "date", "");
    s.y += s.L.blank.height + 8;
  };
  const group = (heading: string, written: Check[], sign: string) => {
    const checks = written.map(([title, body, blanks]): Laid => [title, s.layout(body, { size: T.body, width: s.width - 24 }), blanks]);
    const whole = T.subheading * 1.65 + 40 + checks.reduce((a, c) => a + checkHeight(c), 0) + s.L.blank.height + 14;
    // the whole group on one page when a page can hold it; else at least the heading with its first check
    s.need(whole <= s.bottom - s.top - 40 ? whole : T.subheading * 1.65 + 40 + checkHeight(checks[0]));
    s.subheading(heading);
    checks.forEach((c, i) => {
      // the last check stays with the sign-off
      if (i === checks.length - 1) s.need(checkHeight(c) + s.L.blank.height + 14);
      check(c);
    });
    signOff(sign);
  };

  group(
    "2. Before varnish",
    [
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
    ],
    "all pass: varnish",
  );
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
        : `Seconds only, rotor held safely (see Cautions). Expected at ${sig(plan.supply)} V: ${sig(m.stallCurrentCold)} A cold, ${sig(m.stallCurrent)} A hot. At a reduced supply V the cold stall current is about (V − ${sig(plan.calibration.brush_drop)} V brush drop) ÷ ${ohm(r.terminal_ohm)} Ω.`,
      [
        ["supply", "V", 100],
        ["current", "A", 110],
      ],
    ]);
  }
  group("3. After varnish, cure, skim and balance: the run", run, "result");
}
