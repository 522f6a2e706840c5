/**
 * The rule the fuzz tests hold every input to (not a test file itself): either a plan, or an
 * ArmwindError whose every problem has a snake_case code, a one-line message with no stack trace,
 * and a place: file, line and column for load errors, a field path that the loader can locate for
 * errors the core throws. Anything else thrown is a fault, reported with the input.
 */
import { ArmwindError, type Problem } from "../src/errors.js";
import { loadYaml, type Located } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import type { Plan } from "../src/design/types.js";
import { planJson } from "../src/cli/plan-json.js";
import { planText } from "../src/cli/plan-text.js";
import { locateProblems, reportError } from "../src/cli/io.js";
import type { z } from "zod";

export const FILE = "fuzz.yaml";

/** The rule every problem must keep; throws a plain Error naming the first breach. */
export function checkProblems(problems: Problem[], text: string, where: "load" | "plan"): void {
  if (problems.length === 0) throw new Error("ArmwindError with no problems");
  const lines = text.split("\n").length;
  for (const p of problems) {
    const show = JSON.stringify(p);
    if (!/^[a-z][a-z0-9_]*$/.test(p.code)) throw new Error(`code not snake_case: ${show}`);
    if (typeof p.message !== "string" || p.message.trim() === "") throw new Error(`empty message: ${show}`);
    if (/[\r\n]/.test(p.message)) throw new Error(`message of more than one line: ${show}`);
    if (p.message.includes("    at ")) throw new Error(`stack trace in message: ${show}`);
    if (typeof p.path !== "string") throw new Error(`path not a string: ${show}`);
    if (where === "plan" && p.path === "" && !p.file) throw new Error(`core problem with neither path nor file: ${show}`);
    if (p.file !== FILE) throw new Error(`not located in ${FILE}: ${show}`);
    if (!Number.isInteger(p.line) || (p.line as number) < 1 || (p.line as number) > lines + 1) throw new Error(`bad line: ${show}`);
    if (!Number.isInteger(p.column) || (p.column as number) < 1) throw new Error(`bad column: ${show}`);
  }
}

/** Load a text with any schema; the value, or null after checking the load error against the rule. */
export function loadChecked<S extends z.ZodType>(text: string, schema: S): Located<z.output<S>> | null {
  try {
    return loadYaml(text, FILE, schema);
  } catch (e) {
    if (!(e instanceof ArmwindError)) throw new Error(`load threw ${e instanceof Error ? e.stack : String(e)}\n--- input ---\n${text}`);
    if (e.status !== 1) throw new Error(`load error with status ${e.status}`);
    checkProblems(e.problems, text, "load");
    return null;
  }
}

/** Check an error thrown by the core (it knows no file) as `guarded` would print it. */
export function checkCoreError(e: unknown, text: string, locate: Located<unknown>["locate"]): void {
  if (!(e instanceof ArmwindError)) throw new Error(`the core threw ${e instanceof Error ? e.stack : String(e)}\n--- input ---\n${text}`);
  if (e.status !== 1) throw new Error(`core error with status ${e.status}`);
  for (const p of e.problems) if (p.path === "" || p.file) throw new Error(`core problem without a path: ${JSON.stringify(p)}`);
  checkProblems(locateProblems(e.problems, FILE, locate), text, "plan");
}

/**
 * Check an error whose problems were located by the code that threw it, as the CLI prints it
 * (reportError: one stderr line per problem, and the --json error object).
 */
export function checkPrintedError(e: unknown, text: string): void {
  if (!(e instanceof ArmwindError)) throw new Error(`threw ${e instanceof Error ? e.stack : String(e)}\n--- input ---\n${text}`);
  if (e.status !== 1) throw new Error(`error with status ${e.status}`);
  const out: string[] = [];
  const err: string[] = [];
  reportError({ out: (x) => out.push(x), err: (x) => err.push(x), stdin: () => "", env: {}, cwd: "." }, e, true);
  if (err.length !== e.problems.length || err.some((l) => /[\r\n]/.test(l) || l.includes("    at ")))
    throw new Error(`not one line per problem: ${JSON.stringify(err)}`);
  const json = JSON.parse(out.join("")) as { ok: boolean; errors: Problem[] };
  if (json.ok !== false) throw new Error("ok is not false");
  checkProblems(json.errors, text, "plan");
  for (const p of json.errors) if (p.path === "") throw new Error(`problem without a path: ${JSON.stringify(p)}`);
}

export type Outcome = { kind: "planned"; plan: Plan } | { kind: "load_error" } | { kind: "plan_error" };

/** Load, plan and print (text and JSON) a job text; throws a plain Error on a breach of the rule. */
export function runJobText(text: string): Outcome {
  const loaded = loadChecked(text, jobSchema);
  if (!loaded) return { kind: "load_error" };
  try {
    const plan = planJob(loaded.value);
    for (const w of plan.warnings) {
      if (!/^[a-z][a-z0-9_]*$/.test(w.code) || /[\r\n]/.test(w.message) || w.message.trim() === "") throw new Error(`bad warning ${JSON.stringify(w)}`);
    }
    const json = JSON.stringify(planJson(plan));
    // ok exactly when the plan exits 0, that is when a winding meets the goal (docs/contracts.md "--json output")
    if (!json.startsWith(`{"ok":${plan.feasible},"errors":[]`)) throw new Error("plan JSON does not start with ok (= feasible) and errors: []");
    planText(plan);
    return { kind: "planned", plan };
  } catch (e) {
    checkCoreError(e, text, loaded.locate);
    return { kind: "plan_error" };
  }
}
