/** `armwind card JOB [-o DIR] [--paper a4|letter]`: the PDF job card for the winding jig. */
import type { Argv } from "yargs";
import { statSync } from "node:fs";
import { basename, dirname, join, relative, resolve } from "node:path";
import { guarded, type Io } from "./io.js";
import { planFromFile, planStatus } from "./plan.js";
import { planJson } from "./plan-json.js";
import { VERSION } from "../version.js";
import { writeAtomic } from "./write.js";
import { loadShop } from "./shop.js";
import { firstSet, spoolFor } from "../shop/merge.js";
import { withJob, withLogbook } from "./options.js";
import { resolveMeter, withResolution } from "./meter.js";
import { curvesDrawing, hasCurves } from "../plot/curves.js";
import { drawingSvg } from "../plot/drawing.js";
import { COMMAND_TEXT } from "./commands.js";

export function today(io: Io): string {
  // SOURCE_DATE_EPOCH (reproducible-builds.org) fixes the date for reproducible cards and tests
  const epoch = io.env.SOURCE_DATE_EPOCH;
  const d = epoch && /^\d+$/.test(epoch) ? new Date(Number(epoch) * 1000) : new Date();
  return d.toISOString().slice(0, 10);
}

/**
 * Where the card goes: `-o NAME.pdf` is the card's file (the curves image beside it as
 * NAME-curves.svg); any other `-o` is a folder holding `<id>.pdf`.
 */
export function cardPaths(cwd: string, output: string, id: string): { file: string; dir: string; stem: string } {
  const target = resolve(cwd, output);
  if (/\.pdf$/i.test(output) && !isFolder(target)) return { file: target, dir: dirname(target), stem: basename(target).replace(/\.pdf$/i, "") };
  return { file: join(target, `${id}.pdf`), dir: target, stem: id };
}

function isFolder(p: string): boolean {
  try {
    return statSync(p).isDirectory();
  } catch {
    return false;
  }
}

/** The paper: --paper, else $ARMWIND_PAPER (a4 or letter), else the shop profile's, else A4 (docs/contracts.md's order). */
export function cardPaper(option: string | undefined, env: string | undefined, profile: string | undefined): "a4" | "letter" {
  const envPaper = env && /^(a4|letter)$/i.test(env.trim()) ? env.trim().toLowerCase() : undefined;
  return (firstSet(option, envPaper, profile) ?? "a4") as "a4" | "letter";
}

export function cardCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.card.command,
    COMMAND_TEXT.card.describe,
    (y) =>
      withResolution(withLogbook(withJob(y)), false)
        .option("output", {
          alias: "o",
          type: "string",
          default: "output",
          describe: "folder for the card (created if missing), or the card's file name when it ends in .pdf",
        })
        .option("paper", { choices: ["a4", "letter"] as const, describe: "paper size (default $ARMWIND_PAPER, else the shop profile's paper, else a4)" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, card, curves, plan } as JSON" }),
    async (argv) => {
      setStatus(
        await guarded(io, argv.json, async (where) => {
          const plan = planFromFile(io, argv.job, where, { logbook: argv.logbook, learn: argv.learn });
          // pdfkit and the card load only when a card is asked for
          const { renderCard } = await import("../card/render.js");
          const shop = loadShop(io)?.shop;
          const paper = cardPaper(argv.paper, io.env.ARMWIND_PAPER, shop?.paper);
          const spool = spoolFor(plan, shop);
          const context = { shop: shop?.shop, bench: shop?.bench, meter: resolveMeter(io, argv.resolution), spoolMass: spool?.spool_mass };
          const pdf = await renderCard(plan, { paper, date: today(io), version: VERSION, context });
          const { file, dir, stem } = cardPaths(io.cwd, argv.output, plan.job.id);
          await writeAtomic(file, pdf);
          const shown = relative(io.cwd, file) || file;
          // the curves as an image beside the card (not for series motors or an uncalibrated motor)
          let curves: string | null = null;
          if (hasCurves(plan)) {
            curves = join(dir, `${stem}-curves.svg`);
            await writeAtomic(curves, drawingSvg(curvesDrawing(plan, { width: 720, height: 560, legend: true, size: 9 })));
          }
          if (argv.json) io.out(JSON.stringify({ ok: plan.feasible, errors: [], card: file, curves, feasible: plan.feasible, plan: planJson(plan) }, null, 2));
          else {
            io.out(`card written: ${shown}`);
            if (curves) io.out(`curves image: ${relative(io.cwd, curves) || curves}`);
            io.out(
              `  ${plan.design.turns} turns of ${plan.design.wire.label}${plan.design.strands > 1 ? ` ×${plan.design.strands}` : ""}; cut ${plan.wire.cut.toFixed(1)} m; ${plan.feasible ? "meets the goal" : "does NOT meet the goal (closest winding shown)"}`,
            );
            for (const w of plan.warnings) io.out(`  ! ${w.path ? w.path + ": " : ""}${w.message} [${w.code}]`);
          }
          return planStatus(plan);
        }),
      );
    },
  );
}
