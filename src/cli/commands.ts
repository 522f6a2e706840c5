/**
 * Each command's usage line and one-line description, in the order `armwind --help` lists them:
 * the one place they are written. Top-level help lists commands from this table alone (the
 * command modules, and the job schema they build, are not evaluated for it); each command module
 * registers itself with the same text.
 */
export const COMMAND_TEXT = {
  plan: { command: "plan <job>", describe: "Work out the winding: turns, wire, fill, resistances, cut list, and the motor old and new" },
  check: { command: "check <job>", describe: "Validate a job file and print its warnings (exits as plan would)" },
  card: {
    command: "card <job>",
    describe: "Print the PDF job card for the winding jig: cut list, coil steps, diagram, bench checks, curves, cautions",
  },
  wires: {
    command: "wires",
    describe: "List the wire catalogue: AWG, SWG and IEC 60317 metric sizes with bare and overall diameters, Ω/m and g/m",
  },
  log: {
    command: "log <job>",
    describe: "Record a finished rewind in the logbook: the bench readings beside the plan (exit 4 when a check fails)",
  },
  diagnose: {
    command: "diagnose <job>",
    describe:
      "Judge the bar-to-bar readings by the bench rules, solve them for each coil's resistance and name the coils behind each failing reading (exit 4 when one fails)",
  },
  history: {
    command: "history",
    describe: "List the finished rewinds in the logbook, predicted against measured (table, CSV, JSON, or a scatter plot)",
  },
  schema: { command: "schema", describe: "Print the JSON Schema of the job file, for editors (the YAML language server reads it)" },
  new: {
    command: "new [kind] [job]",
    describe:
      "Start a file to fill in, every field commented: a job file (new job --style …, or new --style …), a measured-readings file for a job (new measured JOB), a shop profile (new shop)",
  },
  serve: {
    command: "serve",
    describe: "The workbench: plan, card, readings and logbook in a web page, for this machine (or, with --host, the shop's network)",
  },
} as const;

export type CommandName = keyof typeof COMMAND_TEXT;
