/** `armwind card JOB [-o DIR] [--paper a4|letter]`: the PDF job card for the winding jig. */
import type { Argv } from "yargs";
import { join, relative, resolve } from "node:path";
import { guarded, type Io } from "./io.js";
import { planFromFile, planStatus } from "./plan.js";
import { planJson } from "./plan-json.js";
import { VERSION } from "./version.js";
import { writeAtomic } from "./write.js";
import { withJob, withLogbook } from "./options.js";
import { curvesDrawing, hasCurves } from "../plot/curves.js";
import { drawingSvg } from "../plot/drawing.js";

export function today(io: Io): string {
  // SOURCE_DATE_EPOCH (reproducible-builds.org) fixes the date for reproducible cards and tests
  const epoch = io.env.SOURCE_DATE_EPOCH;
  const d = epoch && /^\d+$/.test(epoch) ? new Date(Number(epoch) * 1000) : new Date();
  return d.toISOString().slice(0, 10);
}

export function cardCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    "card <job>",
    "Print the PDF job card for the winding jig: cut list, coil steps, diagram, bench checks, curves, cautions",
    (y) =>
      withLogbook(withJob(y))
        .option("output", { alias: "o", type: "string", default: "output", describe: "folder for the card (created if missing)" })
        .option("paper", { choices: ["a4", "letter"] as const, default: "a4" as const, describe: "paper size" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, card, curves, plan } as JSON" }),
    async (argv) => {
      setStatus(
        await guarded(
          io,
          argv.json,
          async (where) => {
            const plan = planFromFile(io, argv.job, where, { logbook: argv.logbook, learn: argv.learn });
            // pdfkit and the card load only when a card is asked for
            const { renderCard } = await import("../card/render.js");
            const pdf = await renderCard(plan, { paper: argv.paper, date: today(io), version: VERSION });
            const file = join(resolve(io.cwd, argv.output), `${plan.job.id}.pdf`);
            await writeAtomic(file, pdf);
            const shown = relative(io.cwd, file) || file;
            // the curves as an image beside the card (not for series motors or an uncalibrated motor)
            let curves: string | null = null;
            if (hasCurves(plan)) {
              curves = join(resolve(io.cwd, argv.output), `${plan.job.id}-curves.svg`);
              await writeAtomic(curves, drawingSvg(curvesDrawing(plan, { width: 720, height: 560, legend: true, size: 9 })));
            }
            if (argv.json) io.out(JSON.stringify({ ok: true, card: file, curves, feasible: plan.feasible, plan: planJson(plan) }, null, 2));
            else {
              io.out(`card written: ${shown}`);
              if (curves) io.out(`curves image: ${relative(io.cwd, curves) || curves}`);
              io.out(`  ${plan.design.turns} turns of ${plan.design.wire.label}${plan.design.strands > 1 ? ` ×${plan.design.strands}` : ""}; cut ${plan.wire.cut.toFixed(1)} m; ${plan.feasible ? "meets the goal" : "does NOT meet the goal (closest winding shown)"}`);
              for (const w of plan.warnings) io.out(`  ! ${w.path ? w.path + ": " : ""}${w.message} [${w.code}]`);
            }
            return planStatus(plan);
          },
        ),
      );
    },
  );
}
