/** `armwind plan JOB [--json]`: the chosen winding and what it will do. Also `armwind check JOB`. */
import type { Argv } from "yargs";
import { planJob, type PlanOptions } from "../design/plan.js";
import type { Plan } from "../design/types.js";
import { guarded, loadJob, type Io, type Where } from "./io.js";
import { planJson } from "./plan-json.js";
import { planText } from "./plan-text.js";
import { logbookOptionsFor } from "./learning.js";
import { withJob, withLogbook } from "./options.js";
import { loadShop } from "./shop.js";
import { spoolWarnings } from "../shop/merge.js";
import { COMMAND_TEXT } from "./commands.js";

export type { Where } from "./io.js";

/** Load a job and plan it; `where` is filled in as soon as the file is known, so later problems are located. */
export function planFromFile(io: Io, file: string, where: Where, opts: { logbook?: string; learn?: boolean } = {}): Plan {
  const { job, file: name, locate } = loadJob(io, file);
  where.file = name;
  where.locate = locate;
  const options: PlanOptions = opts.learn === false ? {} : logbookOptionsFor(io, job, opts.logbook);
  const plan = planJob(job, options);
  // the shop's shelf: a plan that needs more wire than the spool holds says so (src/shop)
  const shop = loadShop(io)?.shop;
  const short = shop ? spoolWarnings(plan, shop) : [];
  return short.length ? { ...plan, warnings: [...plan.warnings, ...short] } : plan;
}

/** Exit status of a plan: 0, or 2 when no winding meets the goal within the limits. */
export function planStatus(plan: Plan): 0 | 2 {
  return plan.feasible ? 0 : 2;
}

export function planCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs
    .command(
      COMMAND_TEXT.plan.command,
      COMMAND_TEXT.plan.describe,
      (y) =>
        withLogbook(withJob(y)).option("json", {
          type: "boolean",
          default: false,
          describe: 'print the plan as JSON (its keys are listed in the README, "The plan --json output")',
        }),
      async (argv) => {
        setStatus(
          await guarded(io, argv.json, (where) => {
            const plan = planFromFile(io, argv.job, where, { logbook: argv.logbook, learn: argv.learn });
            io.out(argv.json ? JSON.stringify(planJson(plan), null, 2) : planText(plan));
            return planStatus(plan);
          }),
        );
      },
    )
    .command(
      COMMAND_TEXT.check.command,
      COMMAND_TEXT.check.describe,
      (y) => withLogbook(withJob(y)).option("json", { type: "boolean", default: false, describe: "print { ok, feasible, warnings } as JSON" }),
      async (argv) => {
        setStatus(
          await guarded(io, argv.json, (where) => {
            const plan = planFromFile(io, argv.job, where, { logbook: argv.logbook, learn: argv.learn });
            if (argv.json) {
              io.out(JSON.stringify({ ok: plan.feasible, errors: [], job_id: plan.job.id, feasible: plan.feasible, warnings: plan.warnings }, null, 2));
            } else {
              io.out(
                `${where.file}: ${plan.job.id} is a valid job file; ${plan.feasible ? "a winding meets the goal" : "no winding meets the goal within the limits"}.`,
              );
              for (const w of plan.warnings) io.out(`  ! ${w.path ? w.path + ": " : ""}${w.message} [${w.code}]`);
            }
            return planStatus(plan);
          }),
        );
      },
    );
}
