/**
 * Problems the user can cause, as values: a stable snake_case code, a message for people,
 * a dotted field path (`armature.slot.area`, `wire_stock[2]`) and, once the loader has mapped
 * the path back into the file, the file, line and column.
 *
 * The core throws an `ArmwindError` carrying one or more problems; the CLI prints each as one
 * line and exits with the error's status. Nothing here touches the terminal.
 */

export interface Problem {
  code: string;
  message: string;
  /** Dotted path with bracketed indices, "" for the file as a whole. */
  path: string;
  file?: string;
  line?: number;
  column?: number;
}

/** Exit statuses of docs/contracts.md: 1 bad input, 2 no winding meets the goal, 3 a file could not be written, 4 a bench check failed. */
export type ExitStatus = 0 | 1 | 2 | 3 | 4;

export class ArmwindError extends Error {
  readonly problems: Problem[];
  readonly status: ExitStatus;
  constructor(problems: Problem[] | Problem, status: ExitStatus = 1) {
    const list = Array.isArray(problems) ? problems : [problems];
    super(list.map((p) => p.message).join("; "));
    this.name = "ArmwindError";
    this.problems = list;
    this.status = status;
  }
}

/** Shorthand for a single bad-input problem. */
export function inputError(code: string, path: string, message: string): ArmwindError {
  return new ArmwindError({ code, path, message }, 1);
}

/** A warning that travels with a plan onto the terminal, the JSON and the card. */
export interface Warning {
  code: string;
  message: string;
  path: string;
}

/** Format a problem as the one line the CLI prints: `file:line:column: path: message [code]`. */
export function formatProblem(p: Problem): string {
  let where = "";
  if (p.file) {
    where = p.file;
    if (p.line !== undefined) where += `:${p.line}:${p.column ?? 1}`;
    where += ": ";
  }
  const path = p.path ? `${p.path}: ` : "";
  return `${where}${path}${p.message} [${p.code}]`;
}
