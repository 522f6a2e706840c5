/**
 * `armwind history [--family F] [--json] [--csv] [--plot FILE.svg|FILE.pdf] [--logbook DIR]`:
 * the finished rewinds, predicted against measured. Damaged records are warnings naming the file
 * (stderr, and `warnings` in the JSON); the rest still list.
 */
import type { Argv } from "yargs";
import { extname, relative, resolve } from "node:path";
import { guarded, type Io } from "./io.js";
import { logbookDir } from "./learning.js";
import { byFileName, type Logbook } from "../logbook/store.js";
import { cacheFolder, refreshIndex } from "../logbook/family-index.js";
import { historyOfFolder } from "../logbook/history-index.js";
import { drawingSvg, historyCsv, historyDrawing, type HistoryRow } from "../logbook/history.js";
import { writeAtomic } from "./write.js";
import { ArmwindError, inputError } from "../errors.js";
import { ohm, sig, table } from "./format.js";
import { COMMAND_TEXT } from "./commands.js";

const pair = (p: number | null, m: number | null, f: (x: number | null) => string) => (p === null && m === null ? "—" : `${f(p)} / ${f(m)}`);

export function historyText(rows: HistoryRow[], book: Logbook, family?: string): string {
  const where = book.dir;
  if (rows.length === 0) {
    return book.exists
      ? `No finished rewinds${family ? ` of family ${family}` : ""} in ${where}.`
      : `No logbook at ${where} yet (armwind log JOB --measured FILE starts it).`;
  }
  const body = rows.map((r) => [
    r.job_id,
    r.date,
    `${r.family ?? "—"}, ${r.style} ${r.slots}/${r.bars}`,
    `${r.turns_per_coil} × ${r.wire}${r.strands_in_hand > 1 ? ` × ${r.strands_in_hand}` : ""}`,
    pair(r.terminal_predicted_ohm, r.terminal_measured_ohm, ohm),
    pair(r.no_load_current_predicted_a, r.no_load_current_measured_a, (x) => sig(x)),
    pair(r.no_load_speed_predicted_rpm, r.no_load_speed_measured_rpm, (x) => (x === null ? "—" : String(Math.round(x)))),
    r.checks_ok ? "ok" : `OUT: ${r.checks_failed.join(", ")}`,
  ]);
  return [
    `${rows.length} finished rewind${rows.length === 1 ? "" : "s"}${family ? ` of family ${family}` : ""} in ${where} (predicted / measured; resistance at 20 °C)`,
    "",
    table(["job", "date", "armature (family, style slots/bars)", "winding (turns × wire)", "terminal Ω", "no-load A", "no-load rpm", "checks"], body, [
      false,
      false,
      false,
      false,
      true,
      true,
      true,
      false,
    ]),
  ].join("\n");
}

export function historyCommand(yargs: Argv, io: Io, setStatus: (n: number) => void) {
  return yargs.command(
    COMMAND_TEXT.history.command,
    COMMAND_TEXT.history.describe,
    (y) =>
      y
        .option("family", { type: "string", describe: "only this armature family" })
        .option("logbook", { type: "string", describe: "logbook folder (default $ARMWIND_LOGBOOK, else jobs/logbook)" })
        .option("json", { type: "boolean", default: false, describe: "print { ok, records, warnings } as JSON" })
        .option("csv", { type: "boolean", default: false, describe: "print the table as CSV for a spreadsheet" })
        .option("plot", { type: "string", describe: "also draw predicted against measured to FILE.svg or FILE.pdf" }),

    async (argv) => setStatus(await guarded(io, argv.json, () => runHistory(io, argv))),
  );
}

interface HistoryArgs {
  family?: string;
  logbook?: string;
  json: boolean;
  csv: boolean;
  plot?: string;
}

/** `armwind history`: check the options, read the rows, draw the plot when asked, print. */
async function runHistory(io: Io, argv: HistoryArgs): Promise<number> {
  checkOptions(argv);
  const { book, rows: all } = readHistory(io, logbookDir(io, argv.logbook));
  for (const w of book.warnings) io.err(`armwind: warning: ${w.message} [${w.code}]`);
  const rows = argv.family === undefined ? all : all.filter((r) => r.family === argv.family);
  if (argv.plot !== undefined) await writePlot(io, argv.plot, rows, argv);
  if (argv.json) io.out(JSON.stringify({ ok: true, errors: [], logbook: book.dir, records: rows, warnings: book.warnings }, null, 2));
  else if (argv.csv) io.out(historyCsv(rows));
  else io.out(historyText(rows, book, argv.family));
  return 0;
}

function checkOptions(argv: HistoryArgs): void {
  if (argv.json && argv.csv) throw inputError("option_conflict", "--csv", "--json and --csv: choose one");
  if (argv.plot !== undefined && ![".svg", ".pdf"].includes(extname(argv.plot).toLowerCase())) {
    throw inputError("bad_plot_file", "--plot", `--plot ${argv.plot}: the plot is written as SVG or PDF; name the file FILE.svg or FILE.pdf`);
  }
}

/**
 * Every record's row, sorted by date then file name (one collator), through the history summary in
 * the user's cache folder (only records changed since the last history are read in full); when any
 * changed, the family index is rewritten from the rows (a record edited in place to another family
 * is then seen by learning).
 */
function readHistory(io: Io, dir: string): { book: Logbook; rows: HistoryRow[] } {
  const cache = cacheFolder(io.env);
  const { book, rows, changed } = historyOfFolder(dir, cache);
  // listing is all history does: a folder it cannot read is an error here (a plan goes on without it)
  if (book.unreadable)
    throw new ArmwindError({
      code: "file_unreadable",
      path: "",
      file: book.dir,
      message: book.warnings[0].message.replace(/; going on without its records$/, ""),
    });
  if (changed)
    refreshIndex(
      book.dir,
      rows.map((r) => [r.file, r.family] as [string, string | null]),
      cache,
    );
  rows.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : byFileName(a.file, b.file)));
  return { book, rows };
}

/** --plot FILE.svg or FILE.pdf: predicted against measured, written whole; said on stderr unless the output is data. */
async function writePlot(io: Io, file: string, rows: HistoryRow[], argv: HistoryArgs): Promise<void> {
  const title = `armwind logbook${argv.family ? `, family ${argv.family}` : ""}`;
  const d = historyDrawing(rows, title);
  const data = extname(file).toLowerCase() === ".pdf" ? await (await import("../logbook/history-pdf.js")).drawingPdf(d, { title }) : drawingSvg(d);
  const at = resolve(io.cwd, file);
  await writeAtomic(at, data);
  if (!argv.json && !argv.csv) io.err(`armwind: plot written to ${relative(io.cwd, at).startsWith("..") ? at : relative(io.cwd, at)}`);
}
