/**
 * The demo jobs' figures worked by hand, kept as fixed numbers with the formula beside each: the
 * code under test does not compute them. Plans here take no logbook (as `plan --no-learn`).
 *
 * Sources: coil resistance R = ρ20·N·MLT/(k·A) with ρ20 = 1/58 Ω·mm²/m (IEC 60028); ring of C equal
 * coils split m / C − m by the brushes: R·m·(C − m)/C (Kirchhoff); AWG d = 0.127 mm·92^((36 − n)/39)
 * (ASTM B258); overall diameters: IEC 60317-0-1 maxima (the reference rows), NEMA MW 1000 from memory;
 * Ke = V/ω from the generator test and the linear DC motor model for the no-load speed
 * ω0 = (Ke·(V − V_b) − R·T_c)/Ke², T_c = Kt·I0 (textbook).
 *
 * Moved on purpose by issue 9 (the figures before are in the comments):
 *  - the old wire's overall diameter comes from the catalogue, no longer 1.08 × bare: the blind motor's
 *    0.22 mm original is taken as grade 2, 0.2637 mm (was 0.2376 mm), so its bundle is thicker, the
 *    fitted end-turn factor smaller (2.188, was 2.341) and the 64-turn coil's mean turn 46.646 mm
 *    (was 48.230 mm): every resistance −3.3 % (the plan now takes 65 turns, 46.756 mm, by issue 10's ranking);
 *  - a weighed old wire is enamelled wire: the drill's 61.6 g of 0.28 mm grade 2 (overall 0.3309 mm)
 *    is 106.36 m at 0.5474 g/m of copper plus 0.0317 g/m of enamel (1.3 g/cm³, from memory); the demo's
 *    mass was 58 g of bare copper (105.96 m) before, raised so that the invented story still holds
 *    (its like-for-like restore reproduces its measured 7.5 Ω at 22 °C); the robot demo's 1.9 g became 2.06 g so
 *    that its plan is still the 98 turns its logbook record was wound with.
 */
import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { planJob } from "../src/design/plan.js";
import { ROOT, loadJobFile } from "./helpers/cli.js";

const rel = (x: number, ref: number) => Math.abs(x / ref - 1);

describe("blind motor (tooth, 5 slots, old wire length, generator test)", () => {
  const p = planJob(loadJobFile(join(ROOT, "jobs/blind-motor-0031.yaml")));
  it("slot and original", () => {
    // free area = 13.5 − 14 × 0.12 = 11.82 mm²
    expect(rel(p.slot.free_area * 1e6, 11.82)).toBeLessThan(1e-9);
    // old mean turn = 14.4 m / (60 turns × 5 coils) = 48 mm
    expect(rel(p.original.mlt * 1e3, 48)).toBeLessThan(1e-9);
    // Ke = 3.52 V / (3000 × 2π/60 rad/s) = 0.0112045 V·s/rad
    expect(rel(p.calibration.ke!, 0.011204507993669432)).toBeLessThan(1e-9);
  });
  it("the chosen 65 × 32 AWG heavy", () => {
    expect(p.design.turns).toBe(65);
    expect(p.design.wire.label).toBe("32 AWG heavy");
    // depth √13.5 = 3.6742 mm, along = 3.6742 − 2 × 0.12 = 3.4342 mm;
    // old overall 0.22 mm grade 2 between the rows 0.213 → 0.255 and 0.234 → 0.281: 0.26367 mm; b_old = 60·0.26367²/3.4342 = 1.2146 mm;
    // f = (48 − 2·12) / (2·3.2 + π·(2·0.12 + 1.2146)) = 2.18784;
    // new d = 0.127·92^(4/39) = 0.20194 mm, overall 0.0092 in = 0.23368 mm, b = 65·0.23368²/3.4342 = 1.03354 mm;
    // MLT = 24 + 2.18784·(6.4 + π·(0.24 + 1.03354)) = 46.7555 mm
    expect(rel(p.wire.mlt * 1e3, 46.75553884050736)).toBeLessThan(1e-6);
    // R_coil = (1/58)·65·0.0467555 m / 0.0320277 mm² = 1.63604 Ω; terminal = R·2·3/5 = 1.96324 Ω
    expect(rel(p.resistance.coil_ohm, 1.6360359176509613)).toBeLessThan(1e-6);
    expect(rel(p.resistance.terminal_ohm, 1.9632431011811537)).toBeLessThan(1e-6);
    for (const r of p.resistance.bar_to_bar) expect(rel(r, (1.6360359176509613 * 4) / 5)).toBeLessThan(1e-6); // R·(C−1)/C
    // Ke_new = 0.0112045·65/60 = 0.0121382; T_c = 0.0112045 × 0.18 A; ω0 = (Ke·11.8 − R·T_c)/Ke² → 9026.59 rpm
    expect(rel(p.motor.ke, 0.012138216993141885)).toBeLessThan(1e-6);
    expect(rel((p.motor.noLoadSpeed! * 60) / (2 * Math.PI), 9026.590600544907)).toBeLessThan(1e-6);
    // cut = (65 × 0.0467555 × 5 + 2 × 0.05 × 5) × 1.1 = 17.265 m
    expect(rel(p.wire.cut, 17.265105135481384)).toBeLessThan(1e-6);
  });
});

describe("drill (lap, 12 slots, 24 bars, weighed old wire, restore)", () => {
  const p = planJob(loadJobFile(join(ROOT, "jobs/drill-lap-0112.yaml")));
  it("the weighed old wire is enamelled wire", () => {
    // A = π/4·0.28² = 0.0615752 mm²; 0.28 grade 2 overall between 0.254 → 0.303 and 0.295 → 0.347: 0.330902 mm;
    // g/m = 8.89·0.0615752 + 1.3·(π/4·0.330902² − 0.0615752) = 0.547404 + 0.031749 = 0.579153;
    // length = 61.6 / 0.579153 = 106.362 m; MLT = 106.362 / (30 × 24) = 147.725 mm
    expect(rel(p.original.mlt * 1e3, 147.72513828270462)).toBeLessThan(1e-6);
  });
  it("the like-for-like restore", () => {
    expect(p.design.turns).toBe(30);
    expect(p.design.wire.label).toBe("0.280 mm grade 2");
    // the same build as the old: the same mean turn, 147.725 mm
    expect(rel(p.wire.mlt * 1e3, 147.72513828270462)).toBeLessThan(1e-6);
    // R_coil = (1/58)·30·0.147725/0.0615752 = 1.24091 Ω
    expect(rel(p.resistance.coil_ohm, 1.2409141085481818)).toBeLessThan(1e-6);
    // 24 coils split 12/12: R·12·12/24 = 6R = 7.44549 Ω for equal coils; the riding spread of the lap coils
    // (each coil laid over earlier ones is a little longer) moves the network's figure by 2e-5
    expect(rel(p.resistance.terminal_ohm, 6 * 1.2409141085481818)).toBeLessThan(1e-4);
    // cut = (30 × 0.147725 × 24 + 2 × 0.06 × 24) × 1.1 = (106.362 + 2.88) × 1.1 = 120.166 m
    expect(rel(p.wire.cut, (106.36209956354732 + 2.88) * 1.1)).toBeLessThan(1e-6);
  });
});

describe("boat (tooth, 7 slots, measured turn)", () => {
  const p = planJob(loadJobFile(join(ROOT, "jobs/boat-7slot-0020.yaml")));
  it("coil and terminal resistance of 18 × 24 AWG heavy on a 70 mm turn", () => {
    expect([p.design.turns, p.design.wire.label, p.design.strands]).toEqual([18, "24 AWG heavy", 1]);
    // d = 0.127·92^(12/39) = 0.510559 mm, A = 0.204730 mm²; R_coil = (1/58)·18·0.070/0.204730 = 0.106111 Ω; 7 coils split 3/4: R·12/7
    expect(rel(p.resistance.coil_ohm, 0.10611100099269724)).toBeLessThan(1e-6);
    expect(rel(p.resistance.terminal_ohm, 0.18190457313033814)).toBeLessThan(1e-6);
  });
});

describe("a wave winding's dead coil is wound and cut like the others (issue 10 point 10)", () => {
  it("22 slots, 21 bars: the old wire's length is shared by 22 coils and the cut list counts 22", async () => {
    const { readFileSync } = await import("node:fs");
    const { loadJobText } = await import("./helpers/cli.js");
    const text = readFileSync(join(ROOT, "jobs/chair-wave-0045.yaml"), "utf8")
      .replace("  slots: 21\n  bars: 21", "  slots: 22\n  bars: 21")
      .replace("  coils_per_slot: 1", "  coils_per_slot: 1\n  dead_coil: true");
    const p = planJob(loadJobText(text));
    expect(p.coils.length).toBe(22);
    expect(p.coils.filter((c) => c.dead).length).toBe(1);
    // old mean turn = 38 m / (14 turns × 22 coils wound) = 123.377 mm (21 live coils would say 129.25 mm)
    expect(rel(p.original.mlt * 1e3, 38000 / (14 * 22))).toBeLessThan(0.02); // the dead coil rides over none: the live mean is a little above
    // cut = (N·k·MLT × 22 + 2 × lead × 22 × k) × (1 + margin)
    const w = p.wire;
    expect(rel(w.winding, w.per_coil * 22)).toBeLessThan(1e-12);
    expect(rel(w.cut, (w.per_coil * 22 + 2 * 0.05 * 22 * p.design.strands) * 1.1)).toBeLessThan(1e-12);
  });
});
