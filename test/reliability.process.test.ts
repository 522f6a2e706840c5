/**
 * Hostile files and faults (issue 14): every reproduction runs the real command (`node
 * dist/cli/main.js`, built by the global setup) under a time limit on the child process, so a hang
 * is a failure with a message, never a stuck suite. Covered: FIFOs and devices where files are
 * expected, size limits, a reader that closes early, a full disk, symlinks at a card's name,
 * absurd values, messages, leftovers of killed writers, an unreadable logbook folder.
 * Checks that need no process run in-process (test/logbook-hostile.test.ts holds the store's).
 */
import { describe, expect, it } from "vitest";
import { chmodSync, existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from "node:fs";
import { spawn, spawnSync } from "node:child_process";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CLI, ROOT } from "./helpers/cli.js";
import { tempHost } from "../src/files.js";

const BLIND = join(ROOT, "jobs", "blind-motor-0031.yaml");
const BLIND_MEASURED = join(ROOT, "jobs", "measured", "blind-motor-0031.yaml");
const LOGBOOK = join(ROOT, "jobs", "logbook");
const blindText = readFileSync(BLIND, "utf8");
/** A hang shows as a failed spawn after this long (well beyond a command's few seconds on a busy machine). */
const LIMIT_MS = 30_000;

const tmp = () => {
  const d = mkdtempSync(join(tmpdir(), "armwind-reliability-"));
  chmodSync(d, 0o755);
  return d;
};

interface Run {
  status: number;
  stdout: string;
  stderr: string;
}

/** The real command with a time limit on the child (a kill, not a timed assertion). */
function run(args: string[], opts: { cwd?: string; input?: string; env?: Record<string, string>; uid?: number } = {}): Run {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    cwd: opts.cwd ?? ROOT,
    input: opts.input,
    encoding: "utf8",
    timeout: LIMIT_MS,
    killSignal: "SIGKILL",
    maxBuffer: 64 * 1024 * 1024,
    uid: opts.uid,
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: LOGBOOK, ...opts.env },
  });
  if (r.error) throw new Error(`armwind ${args.join(" ")}: ${r.error.message} (killed after ${LIMIT_MS} ms: it hung)`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** A shell pipeline, with a time limit; prints the command's own status on the last line of stdout. */
function shell(script: string): Run {
  const r = spawnSync("bash", ["-c", script], {
    cwd: ROOT,
    encoding: "utf8",
    timeout: LIMIT_MS,
    killSignal: "SIGKILL",
    env: { ...process.env, NO_COLOR: "1", ARMWIND_LOGBOOK: LOGBOOK },
  });
  if (r.error) throw new Error(`${script}: ${r.error.message}`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

function jobWith(edit: (s: string) => string, dir = tmp(), name = "job.yaml"): string {
  const f = join(dir, name);
  writeFileSync(f, edit(blindText));
  return f;
}

const lineOf = (text: string, needle: string) => text.split("\n").findIndex((l) => l.includes(needle)) + 1;

/** A logbook folder with the demo records and `extra` entries made by `make`. */
function logbookWith(make: (dir: string) => void): string {
  const dir = join(tmp(), "book");
  mkdirSync(dir);
  for (const f of readdirSync(LOGBOOK)) writeFileSync(join(dir, f), readFileSync(join(LOGBOOK, f)));
  make(dir);
  return dir;
}

/** A process id that is not running (a child that has ended). */
function deadPid(): number {
  const r = spawnSync(process.execPath, ["-e", "process.stdout.write(String(process.pid))"], { encoding: "utf8" });
  return Number(r.stdout);
}

describe("1. files that are not files are refused, never waited on", () => {
  it("a FIFO and a link to /dev/zero named like records: history and a learning plan finish, each a record_damaged warning", () => {
    const dir = logbookWith((d) => {
      spawnSync("mkfifo", [join(d, "blind-motor-0031-2026-12-02-7.yaml")]);
      symlinkSync("/dev/zero", join(d, "blind-motor-0031-2026-12-02-8.yaml"));
    });
    const h = run(["history", "--json", "--logbook", dir]);
    expect(h.status).toBe(0);
    const out = JSON.parse(h.stdout);
    expect(out.records).toHaveLength(readdirSync(LOGBOOK).length);
    expect(out.warnings.map((w: { file: string; code: string }) => `${w.code} ${w.file}`).sort()).toEqual([
      "record_damaged blind-motor-0031-2026-12-02-7.yaml",
      "record_damaged blind-motor-0031-2026-12-02-8.yaml",
    ]);
    expect(out.warnings[0].message).toMatch(/FIFO/);
    expect(out.warnings[1].message).toMatch(/character device/);
    const p = run(["plan", BLIND, "--json", "--logbook", dir]);
    expect(p.status).toBe(0);
    expect(p.stderr).toMatch(/blind-motor-0031-2026-12-02-7\.yaml: damaged record.*FIFO.*\[record_damaged\]/);
    expect(JSON.parse(p.stdout).ok).toBe(true);
  });

  it("a job file that is /dev/zero, a FIFO or a folder: one line, exit 1", () => {
    const d = tmp();
    spawnSync("mkfifo", [join(d, "fifo.yaml")]);
    for (const [file, what] of [
      ["/dev/zero", "a character device"],
      [join(d, "fifo.yaml"), "a FIFO"],
      [d, "a folder"],
    ] as const) {
      const r = run(["plan", file]);
      expect(r.status, file).toBe(1);
      expect(r.stderr.trim().split("\n"), r.stderr).toHaveLength(1);
      expect(r.stderr).toContain(`${file}: is ${what}`);
      expect(r.stderr).toMatch(/\[not_a_file\]$/m);
    }
  });

  it("a measured file that is a FIFO: log refuses it and writes nothing", () => {
    const d = tmp();
    spawnSync("mkfifo", [join(d, "m.yaml")]);
    const r = run(["log", BLIND, "--measured", join(d, "m.yaml"), "--logbook", join(d, "book"), "--no-learn"]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/m\.yaml: is a FIFO.*\[not_a_file\]/);
    expect(existsSync(join(d, "book"))).toBe(false);
  });
});

describe("2. every read has a size limit (README: 1 MiB a file, 4 MiB a record)", () => {
  it("standard input from /dev/zero and a 2 MiB job file are refused with one line; a piped job still plans", () => {
    const z = shell(`node ${CLI} plan - < /dev/zero; echo "status $?"`);
    expect(z.stdout).toMatch(/status 1\n$/);
    expect(z.stderr).toMatch(/^<stdin>: standard input is larger than 1 MiB.*\[file_too_large\]\n$/);
    const big = jobWith((s) => s + `\nnotes: ${"x".repeat(2 * 1024 * 1024)}\n`);
    const r = run(["plan", big]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/job\.yaml: larger than 1 MiB.*\[file_too_large\]\n$/);
    const piped = shell(`cat ${BLIND} | node ${CLI} plan - | head -1; echo "status \${PIPESTATUS[1]}"`);
    expect(piped.stdout).toMatch(/^blind-motor-0031: .*\nstatus 0\n$/);
  });

  it("long text fields, long wire stocks and reading lists are refused by count, not parsed for a minute", () => {
    const notes = run(["check", jobWith((s) => s.replace(/^title: .*/m, `title: ${"n".repeat(30_000)}`))]);
    expect(notes.status).toBe(1);
    expect(notes.stderr).toMatch(/title: the text is 30000 characters long; at most 20000 are read here \[out_of_range\]/);
    const stock = run(["check", jobWith((s) => s.replace(/^wire_stock:[\s\S]*?(?=^\w)/m, "") + `wire_stock: [${Array(1500).fill('"0.2 mm"').join(", ")}]\n`)]);
    expect(stock.status).toBe(1);
    expect(stock.stderr).toMatch(/wire_stock: the list has 1500 items; at most 1000 are read here \[out_of_range\]/);
  });
});

describe("4. one output routine: a reader that closes early, a full disk", () => {
  it("plan | (reader gone) and wires --json | head -1: status 0, nothing on stderr", () => {
    const gone = shell(`node ${CLI} plan ${BLIND} 2>err.$$ | true; s=\${PIPESTATUS[0]}; cat err.$$ >&2; rm -f err.$$; echo "status $s"`);
    expect(gone.stdout).toBe("status 0\n");
    expect(gone.stderr).toBe("");
    const head = shell(`node ${CLI} wires --json 2>err.$$ | head -1; s=\${PIPESTATUS[0]}; cat err.$$ >&2; rm -f err.$$; echo "status $s"`);
    expect(head.stdout).toBe("{\nstatus 0\n");
    expect(head.stderr).toBe("");
  });

  it("standard output on a full disk (/dev/full): exit 3, one line, no stack trace", () => {
    const r = shell(`node ${CLI} plan ${BLIND} --json > /dev/full; echo "status $?"`);
    expect(r.stdout).toBe("status 3\n");
    expect(r.stderr).toBe("armwind: cannot write to standard output: the disk is full [write_failed]\n");
  });
});

describe("5 and 11. cards: never through a symlink, leftovers of killed writers removed", () => {
  it("a symlink at the card's and the curves' names is replaced; the files it pointed to are untouched", () => {
    const out = tmp();
    const victim = join(tmp(), "precious.txt");
    writeFileSync(victim, "keep me");
    symlinkSync(victim, join(out, "blind-motor-0031.pdf"));
    symlinkSync(victim, join(out, "blind-motor-0031-curves.svg"));
    const r = run(["card", BLIND, "-o", out, "--no-learn"]);
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(victim, "utf8")).toBe("keep me");
    expect(lstatSync(join(out, "blind-motor-0031.pdf")).isFile()).toBe(true);
    expect(readFileSync(join(out, "blind-motor-0031.pdf")).subarray(0, 5).toString()).toBe("%PDF-");
    expect(lstatSync(join(out, "blind-motor-0031-curves.svg")).isFile()).toBe(true);
  });

  it("a killed writer's temporary card of this host is removed by the next card; another host's and a live process's are kept", () => {
    const out = tmp();
    const host = tempHost();
    const mine = `.blind-motor-0031.pdf.${host}.${deadPid()}.0123456789ab.tmp`;
    const live = `.blind-motor-0031.pdf.${host}.${process.pid}.0123456789ab.tmp`;
    const other = `.blind-motor-0031.pdf.another-bench.${deadPid()}.0123456789ab.tmp`;
    for (const f of [mine, live, other]) writeFileSync(join(out, f), "%PDF- complete but never renamed");
    const r = run(["card", BLIND, "-o", out, "--no-learn"]);
    expect(r.status, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual([live, other, "blind-motor-0031-curves.svg", "blind-motor-0031.pdf"].sort());
  });
});

describe("7 and 9. refusals that say what is wrong, where", () => {
  it("a tooth winding with more poles than slots is refused at field_poles, naming the poles that fit", () => {
    const f = jobWith((s) => s.replace("field_poles: 2", "field_poles: 6"));
    const r = run(["plan", f]);
    expect(r.status).toBe(1);
    expect(r.stderr).toBe(
      `${f}:${lineOf(blindText, "field_poles:")}:16: armature.field_poles: a tooth winding needs at least as many teeth as field poles: 6 poles on 5 teeth put each coil across more than a pole pitch, where its sides cancel; count the stator's poles again (at most 4 here) or the slots [poles_invalid]\n`,
    );
  });

  it("absurd values are out of range where they are read: slot area, speed goal, --temperature, a reading", () => {
    const area = run(["plan", jobWith((s) => s.replace("area: 13.5 mm2", "area: 1e300 mm2"))]);
    expect(area.stderr).toMatch(/armature\.slot\.area: must be at most 100000 mm2, got "1e300 mm2" \[out_of_range\]/);
    const big = run(["plan", jobWith((s) => s.replace("area: 13.5 mm2", "area: 100 mm2"))]);
    expect(big.status).toBe(1);
    expect(big.stderr).toMatch(
      /armature\.slot\.area: 5 slots of 100 mm² are more than the whole cross-section of a 20 mm rotor \(314 mm²\).*\[inconsistent_geometry\]/,
    );
    const speed = run(["plan", jobWith((s) => s.replace("no_load_speed: 9000 rpm", "no_load_speed: 1e308 rpm"))]);
    expect(speed.stderr).toMatch(/target\.no_load_speed: must be at most 1000000 rpm.*\[out_of_range\]/);
    expect(speed.stderr + speed.stdout).not.toMatch(/Infinity/);
    const t = run(["diagnose", BLIND, "--bars", "1,1,1,1,1", "--temperature", "1e308", "--no-learn"]);
    expect(t.status).toBe(1);
    expect(t.stderr).toBe("--temperature: --temperature 1e308: must be at most 250 C [out_of_range]\n");
    const reading = run(["diagnose", BLIND, "--bars", "1.3,1.3,1e308,1.3,1.3", "--no-learn", "--json"]);
    expect(reading.status).toBe(1);
    expect(JSON.parse(reading.stdout).errors).toEqual([
      { code: "out_of_range", message: 'r3 "1e308": must be at most 1000 Mohm', file: null, line: null, column: null, path: "--bars[2]" },
    ]);
  });
});

describe("8. --json keeps one shape for every exit status", () => {
  it("diagnose with a coil out of tolerance: exit 4, ok false, errors [], failures naming the coil", () => {
    const r = run(["diagnose", BLIND, "--bars", "1.33,1.33,1.10,1.33,1.33", "--no-learn", "--json"]);
    expect(r.status).toBe(4);
    const j = JSON.parse(r.stdout);
    expect(j.ok).toBe(false);
    expect(j.errors).toEqual([]);
    expect(j.failures.length).toBeGreaterThan(0);
    expect(j.failures[0]).toMatchObject({ coils: [3], rule: expect.any(String) });
  });
});

describe("10. messages", () => {
  it("several YAML documents in one file say so, at the second", () => {
    const f = jobWith((s) => `${s}\n---\nversion: 1\n`);
    const r = run(["check", f]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/job\.yaml:\d+:1: the file holds more than one YAML document \(a line --- starts another here\).*\[bad_yaml\]\n$/);
    expect(r.stderr).not.toMatch(/parseAllDocuments/);
  });

  it("an over-long id names the length; a Windows device name is refused; a NUL is shown escaped", () => {
    const long = run(["check", jobWith((s) => s.replace(/^id: .*/m, `id: ${"a".repeat(120)}`))]);
    expect(long.stderr).toMatch(/id: is 120 characters long; an id names files, so keep it to 80 or fewer \[bad_id\]/);
    for (const id of ["CON", "nul", "com1.a"]) {
      const r = run(["check", jobWith((s) => s.replace(/^id: .*/m, `id: ${id}`))]);
      expect(r.stderr, id).toMatch(/id: ".*" is a device name on Windows.*\[bad_id\]/);
    }
    const d = tmp();
    writeFileSync(join(d, "m.yaml"), readFileSync(BLIND_MEASURED, "utf8").replace(/^job: .*/m, 'job: "blind\\0motor"'));
    const nul = run(["log", BLIND, "--measured", join(d, "m.yaml"), "--logbook", join(d, "book"), "--no-learn"]);
    expect(nul.status).toBe(1);
    expect(nul.stderr).not.toContain("\u0000");
    expect(nul.stderr).toContain('job "blind\\u0000motor"');
  });

  it("problems in command-line options are not located in the job file", () => {
    const r = run(["diagnose", BLIND, "--bars", "1,1,x,1,1", "--no-learn"]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^--bars\[2\]: r3 "x": "x" is not a number with a unit; write it like "1.57 ohm".* \[bad_quantity\]\n$/);
  });

  it("a temperature in kelvin prints rounded (20.9 °C, not 20.850000000000023 °C)", () => {
    const d = tmp();
    writeFileSync(join(d, "m.yaml"), readFileSync(BLIND_MEASURED, "utf8").replace(/^temperature: .*/m, "temperature: 294 K"));
    const r = run(["log", BLIND, "--measured", join(d, "m.yaml"), "--logbook", join(d, "book"), "--no-learn"]);
    expect(r.stdout).toMatch(/^Readings at 20\.9 °C;/m);
  });
});

describe("11. an unreadable logbook folder, read-only folders (as an unprivileged user)", () => {
  // root reads and writes everything: these run the command as nobody (uid 65534)
  const asNobody = process.getuid?.() === 0;
  it.skipIf(!asNobody)("an unreadable logbook folder: plan goes on without learning, with a warning; history exits 1", () => {
    const dir = join(tmp(), "book");
    mkdirSync(dir, 0o000);
    const p = run(["plan", BLIND, "--json", "--logbook", dir], { uid: 65534 });
    expect(p.status, p.stderr).toBe(0);
    expect(p.stderr).toMatch(/the logbook folder .*book cannot be read \(permission denied\); going on without its records \[logbook_unreadable\]/);
    const h = run(["history", "--logbook", dir], { uid: 65534 });
    expect(h.status).toBe(1);
    expect(h.stderr).toMatch(/cannot be read \(permission denied\) \[file_unreadable\]\n$/);
  });

  it.skipIf(!asNobody)("a log into a read-only folder names the folder, not a hidden temporary file; an unreadable record is not 'not valid YAML'", () => {
    const dir = join(tmp(), "book");
    mkdirSync(dir, 0o555);
    const r = run(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--no-learn"], { uid: 65534 });
    expect(r.status).toBe(3);
    expect(r.stderr).toBe(`${dir}: cannot write the logbook record: permission denied; choose another folder with --logbook DIR [write_failed]\n`);
    const book = logbookWith((d) => chmodSync(join(d, "blind-motor-0031-2026-12-01-1.yaml"), 0o000));
    chmodSync(book, 0o755);
    const h = run(["history", "--logbook", book], { uid: 65534 });
    expect(h.stderr).toMatch(/blind-motor-0031-2026-12-01-1\.yaml: damaged record, left out \(cannot be read \(permission denied\)\) \[record_damaged\]/);
    expect(h.stderr).not.toMatch(/not valid YAML/);
  });

  it("a log killed mid-write leaves a hidden temporary file; the next log on this host removes it", async () => {
    const dir = join(tmp(), "book");
    // ARMWIND_LOG_HOLD_MS: the store sleeps with half of its temporary file written
    const child = spawn(process.execPath, [CLI, "log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--no-learn"], {
      cwd: ROOT,
      env: { ...process.env, ARMWIND_LOG_HOLD_MS: "60000" },
      stdio: "ignore",
    });
    const closed = new Promise((resolve) => child.on("close", resolve));
    let litter: string[] = [];
    for (let i = 0; i < 3000 && litter.length === 0; i++) {
      await new Promise((r) => setTimeout(r, 10));
      litter = existsSync(dir) ? readdirSync(dir) : [];
    }
    child.kill("SIGKILL");
    await closed;
    expect(litter).toHaveLength(1);
    expect(litter[0]).toMatch(new RegExp(`^\\.blind-motor-0031-2026-12-01\\.${tempHost()}\\.${child.pid}\\.[0-9a-f]{12}\\.tmp$`));
    expect(readdirSync(dir)).toEqual(litter);
    const second = run(["log", BLIND, "--measured", BLIND_MEASURED, "--logbook", dir, "--no-learn"], { env: { ARMWIND_BENCH: "rel" } });
    expect(second.status, second.stderr).toBe(0);
    expect(readdirSync(dir)).toEqual(["blind-motor-0031-2026-12-01-rel-1.yaml"]);
  });
});

describe("6. absurd logbook records are not learned from", () => {
  it("a record with a 1e300 mm turn length and 1e9 turns leaves the plan as the sound records make it", () => {
    const rec = readFileSync(join(LOGBOOK, "blind-motor-0031-2026-12-01-1.yaml"), "utf8");
    const base = logbookWith(() => {});
    const hostile = logbookWith((d) => {
      const j = JSON.parse(rec.slice(rec.indexOf("{")));
      j.derived.mean_turn_length_mm = 1e300;
      writeFileSync(join(d, "blind-motor-0031-2026-12-02-1.yaml"), JSON.stringify(j));
      const k = JSON.parse(rec.slice(rec.indexOf("{")));
      k.winding.turns = 1e9;
      writeFileSync(join(d, "blind-motor-0031-2026-12-02-2.yaml"), JSON.stringify(k));
    });
    const a = run(["plan", BLIND, "--json", "--logbook", base]);
    const b = run(["plan", BLIND, "--json", "--logbook", hostile]);
    expect(b.status).toBe(0);
    expect(JSON.parse(b.stdout)).toEqual(JSON.parse(a.stdout));
    expect(b.stderr).toMatch(
      /blind-motor-0031-2026-12-02-1\.yaml: damaged record, left out \(derived\.mean_turn_length_mm: out of range \(above 5000\)\) \[record_damaged\]/,
    );
    expect(b.stderr).toMatch(
      /blind-motor-0031-2026-12-02-2\.yaml: damaged record, left out \(winding\.turns: out of range \(above 100000\)\) \[record_damaged\]/,
    );
  });
});
