/**
 * Start-up aims (issue 15), whole processes of the installed command (bin/armwind.mjs: the bundle
 * with its code cache), each against a floor measured in the same run, runs alternating:
 *  - `plan` on a demo job ≤ 2.5 × `node -e ''`;  `--help` ≤ 2 × `node -e ''`;
 *  - `card` ≤ 1.6 × a bare one-page pdfkit script in a built-in font (bench/bare-pdfkit.mjs).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { aim, alternate } from "./proc.js";

export function benchStartup(runs = 9): string[] {
  const dir = mkdtempSync(join(tmpdir(), "armwind-bench-"));
  const t = alternate(
    {
      node: { args: ["-e", ""] },
      plan: { args: ["bin/armwind.mjs", "plan", "jobs/blind-motor-0031.yaml"] },
      help: { args: ["bin/armwind.mjs", "--help"] },
      bare: { args: ["bench/bare-pdfkit.mjs", join(dir, "bare.pdf")] },
      card: { args: ["bin/armwind.mjs", "card", "jobs/blind-motor-0031.yaml", "-o", dir] },
    },
    runs,
  );
  rmSync(dir, { recursive: true, force: true });
  const ms = (x: number) => `${x.toFixed(0)} ms`;
  console.log(`start-up (whole processes, medians of ${runs} alternating runs): node -e '' ${ms(t.node)}, bare pdfkit page ${ms(t.bare)}`);
  const lines = [
    aim("plan blind-motor-0031 / node -e ''", `${ms(t.plan)}, ${(t.plan / t.node).toFixed(2)} ×`, t.plan <= 2.5 * t.node, "≤ 2.5 ×"),
    aim("--help / node -e ''", `${ms(t.help)}, ${(t.help / t.node).toFixed(2)} ×`, t.help <= 2 * t.node, "≤ 2 ×"),
    aim("card blind-motor-0031 / bare pdfkit page", `${ms(t.card)}, ${(t.card / t.bare).toFixed(2)} ×`, t.card <= 1.6 * t.bare, "≤ 1.6 ×"),
  ];
  for (const l of lines) console.log(l);
  return lines;
}
