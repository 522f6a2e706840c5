/**
 * The edge's number formatting (src/format/number.ts): 3 significant figures (resistance 4), signed
 * percentages, and float noise printed as the zero it is. Expected strings worked by hand.
 */
import { describe, expect, it } from "vitest";
import { ohm, sig, signedPct } from "../src/format/number.js";
import { runMain, ROOT } from "./helpers/cli.js";
import { join } from "node:path";

describe("numbers at the edge", () => {
  it("3 significant figures, resistance 4, the minus sign U+2212", () => {
    expect(sig(1234.5)).toBe("1235");
    expect(sig(0.0123456)).toBe("0.0123");
    expect(sig(-2.5)).toBe("−2.50");
    expect(ohm(1.30882)).toBe("1.309");
  });
  it("float noise is zero, not −0.000000000000 (a deviation of −1.1e-16)", () => {
    expect(sig(-1.1102230246251565e-14)).toBe("0");
    expect(sig(1e-15)).toBe("0");
    expect(signedPct(-1.1102230246251565e-16)).toBe("0 %");
    expect(signedPct(-0.0004, 1)).toBe("0.0 %");
  });
  it("a signed percentage: + and − on either side of zero, 3 significant figures or the decimals asked", () => {
    expect(signedPct(0.001962)).toBe("+0.196 %");
    expect(signedPct(-0.0916)).toBe("−9.16 %");
    expect(signedPct(0.006, 1)).toBe("+0.6 %");
    expect(signedPct(-0.0225, 1)).toBe("−2.3 %");
  });
  it("diagnose's table prints a coil that reads exactly as expected without a sign (the demo's coil 2)", async () => {
    const r = await runMain(
      ["diagnose", join(ROOT, "jobs/blind-motor-0031.yaml"), "--measured", join(ROOT, "jobs/measured/blind-motor-0031-coil3-short.yaml"), "--no-learn"],
      { cwd: ROOT },
    );
    expect(r.stdout).not.toMatch(/0\.0{6,}/);
    expect(r.stdout).toMatch(/^ {3}2 .* 0 % {2}ok$/m);
  });
});
