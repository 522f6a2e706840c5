/**
 * The command line's edges, through the real command (`node bin/armwind.mjs`, built by the global
 * setup): exit statuses 0, 1, 2, 3 of DESIGN.md; problems as one `file:line:column: path: message
 * [code]` line each on stderr with no stack trace; the `--json` error object; standard input as
 * `-`; no colour escapes anywhere (NO_COLOR, no-color.org; armwind prints no colour at all).
 */
import { describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { spawnSync } from "node:child_process";
import { CLI, ROOT, runCli, runMain, type CliResult } from "./helpers/cli.js";

const BLIND = join(ROOT, "jobs", "blind-motor-0031.yaml");
const blindText = readFileSync(BLIND, "utf8");
const tmp = () => mkdtempSync(join(tmpdir(), "armwind-cli-io-"));
/** `file:line:column: path: message [code]`, one line. */
const LINE = /^(?<file>[^\n]+?):(?<line>\d+):(?<column>\d+): (?:(?<path>[\w.$[\]]+): )?(?<message>[^\n]+) \[(?<code>[a-z][a-z0-9_]*)\]$/;
// biome-ignore lint/suspicious/noControlCharactersInRegex: the escape character is what is looked for
const ANSI = /\u001b\[/;

/** runCli, but a hang is a failure, not a stuck suite (spawnSync kills the command after `ms`). */
function runCliWithin(ms: number, args: string[]): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: "utf8", timeout: ms, env: { ...process.env, NO_COLOR: "1" } });
  if (r.error) throw new Error(`armwind ${args.join(" ")}: ${r.error.message}`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

function jobWith(edit: (s: string) => string, name = "blind.yaml"): string {
  const f = join(tmp(), name);
  writeFileSync(f, edit(blindText));
  return f;
}

const lineOf = (text: string, needle: string) => text.split("\n").findIndex((l) => l.includes(needle)) + 1;

function expectOneLocatedLine(r: CliResult, status: number): RegExpExecArray["groups"] {
  expect(r.status).toBe(status);
  const lines = r.stderr.replace(/\n$/, "").split("\n");
  expect(lines, r.stderr).toHaveLength(1);
  expect(r.stderr).not.toMatch(/ {4}at |Error:/);
  const m = LINE.exec(lines[0]);
  expect(m, lines[0]).not.toBeNull();
  return m!.groups;
}

describe("exit statuses through the real command", () => {
  it("0: the plan on stdout, nothing on stderr", () => {
    const r = runCli(["plan", BLIND]);
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    expect(r.stdout).toMatch(/^blind-motor-0031: /);
  });

  it("1: an unknown key is one line at the key, naming the nearest known key", () => {
    const f = jobWith((s) => s.replace("  stack_length:", "  stak_length:"));
    const g = expectOneLocatedLine(runCli(["plan", f]), 1);
    expect(g).toMatchObject({ file: f, line: String(lineOf(blindText, "stack_length:")), column: "3", path: "armature.stak_length", code: "unknown_key" });
    expect(g!.message).toBe('unknown key "stak_length"; did you mean "stack_length"?');
  });

  it("1: a missing field names its path", () => {
    const f = jobWith((s) => s.replace(/\n  rotor_diameter: .*/, ""));
    const g = expectOneLocatedLine(runCli(["plan", f]), 1);
    expect(g).toMatchObject({ path: "armature.rotor_diameter", code: "missing_field" });
    expect(g!.message).toMatch(/^missing/);
  });

  it("1: a value without a sensible unit names the units that would be right", () => {
    const f = jobWith((s) => s.replace("stack_length: 12 mm", "stack_length: 12 V"));
    const g = expectOneLocatedLine(runCli(["plan", f]), 1);
    expect(g).toMatchObject({ line: String(lineOf(blindText, "stack_length:")), column: "17", path: "armature.stack_length", code: "bad_quantity" });
    expect(g!.message).toBe('unknown unit "V" for a length ("V" is a unit of voltage); use one of mm, cm, m, um, in, mil');
  });

  it("1: bars that do not suit the slots: the winding layout's problem, located at the bars", () => {
    const f = jobWith((s) => s.replace("  bars: 5", "  bars: 7"));
    const g = expectOneLocatedLine(runCli(["plan", f]), 1);
    expect(g).toMatchObject({ file: f, line: String(lineOf(blindText, "  bars: 5")), column: "9", path: "armature.bars", code: "bars_mismatch" });
    expect(g!.message).toMatch(/5.*7|7.*5/);
  });

  it("1 with --json: stdout is { ok: false, errors: [ { code, message, file, line, column, path } ] }", () => {
    const f = jobWith((s) => s.replace("  stack_length:", "  stak_length:"));
    const r = runCli(["plan", f, "--json"]);
    expect(r.status).toBe(1);
    const body = JSON.parse(r.stdout);
    expect(Object.keys(body)).toEqual(["ok", "errors"]);
    expect(body.ok).toBe(false);
    expect(body.errors).toHaveLength(1);
    expect(Object.keys(body.errors[0])).toEqual(["code", "message", "file", "line", "column", "path"]);
    expect(body.errors[0]).toEqual({
      code: "unknown_key",
      message: 'unknown key "stak_length"; did you mean "stack_length"?',
      file: f,
      line: lineOf(blindText, "stack_length:"),
      column: 3,
      path: "armature.stak_length",
    });
  });

  it("1: broken YAML is one located line", () => {
    const f = jobWith((s) => s.replace("slots: 5", "slots: [5"));
    const g = expectOneLocatedLine(runCli(["check", f]), 1);
    expect(g).toMatchObject({ file: f, code: "bad_yaml" });
    expect(g!.message).toMatch(/^not valid YAML: /);
  });

  it("1: an unknown option is one line, and nothing is planned", () => {
    const r = runCli(["plan", BLIND, "--bogus"]);
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/bogus/);
    expect(r.stdout).toBe("");
  });

  it("2: no winding meets the goal; the closest is still printed", () => {
    const f = jobWith((s) => s.replace("no_load_speed: 9000 rpm", "no_load_speed: 90000 rpm"));
    const r = runCli(["plan", f]);
    expect(r.status).toBe(2);
    expect(r.stdout).toMatch(/CLOSEST \(does not meet the goal\): \d+ turns per coil/);
  });

  it("3: a card into an impossible folder (/proc) or under a regular file, one line each", () => {
    for (const out of [
      "/proc/armwind-cards",
      join(
        jobWith((s) => s),
        "sub",
      ),
    ]) {
      const r = runCliWithin(15_000, ["card", BLIND, "-o", out]);
      expect(r.status).toBe(3);
      // a file that could not be written has no line: `file: message [code]`
      const lines = r.stderr.replace(/\n$/, "").split("\n");
      expect(lines, r.stderr).toHaveLength(1);
      expect(lines[0]).toMatch(/^\S+blind-motor-0031\.pdf: cannot write .* \[write_failed\]$/);
      expect(r.stderr).not.toMatch(/ {4}at /);
    }
  });

  it("3: schema -o and new into impossible places; new onto an existing file", () => {
    const dir = tmp();
    const s = runCli(["schema", "-o", "/proc/armwind/job.schema.json"], { cwd: dir });
    expect(s.status).toBe(3);
    expect(s.stderr.trim().split("\n")).toHaveLength(1);
    expect(s.stderr).toMatch(/\[write_failed\]$/m);
    expect(runCli(["new", "--style", "tooth", "--id", "j1"], { cwd: dir }).status).toBe(0);
    const again = runCli(["new", "--style", "lap", "--id", "j1"], { cwd: dir });
    expect(again.status).toBe(3);
    expect(again.stderr).toBe("j1.yaml: already exists; armwind new never overwrites a file: choose another name with -o FILE or --id ID [file_exists]\n");
    expect(readFileSync(join(dir, "j1.yaml"), "utf8")).toMatch(/^# yaml-language-server: \$schema=/);
    expect(readFileSync(join(dir, "j1.yaml"), "utf8")).toMatch(/style: tooth/);
  });
});

describe("standard input as -", () => {
  it("plans a job read from standard input", () => {
    const r = runCli(["plan", "-", "--json"], { input: blindText });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).job_id).toBe("blind-motor-0031");
  });

  it("locates problems in standard input as <stdin>:line:column", () => {
    const r = runCli(["check", "-"], { input: blindText.replace("  bars: 5", "  bars: 7") });
    const g = expectOneLocatedLine(r, 1);
    expect(g).toMatchObject({ file: "<stdin>", line: String(lineOf(blindText, "  bars: 5")), path: "armature.bars" });
  });

  it("a job from standard input can become a card", () => {
    const dir = tmp();
    const r = runCli(["card", "-", "-o", dir], { input: blindText });
    expect([0, 2]).toContain(r.status);
    expect(existsSync(join(dir, "blind-motor-0031.pdf"))).toBe(true);
  });
});

describe("no colour", () => {
  it("no ANSI escape in any output, with NO_COLOR set or not", async () => {
    const bad = jobWith((s) => s.replace("  stack_length:", "  stak_length:"));
    const runs: string[][] = [["plan", BLIND], ["wires", "--system", "awg"], ["plan", bad, "--json"], ["--help"], ["plan"]];
    for (const env of [{ NO_COLOR: "1" }, { NO_COLOR: "", FORCE_COLOR: "1" }] as Record<string, string>[]) {
      // in-process (what is checked is the text, not the process); one real process with FORCE_COLOR below
      for (const args of runs) {
        const r = await runMain(args, { env });
        expect(r.stdout + r.stderr, args.join(" ")).not.toMatch(ANSI);
        expect(r.stdout + r.stderr).not.toBe("");
      }
    }
    const real = runCli(["plan", bad], { env: { NO_COLOR: "", FORCE_COLOR: "1" } });
    expect(real.stderr).not.toMatch(ANSI);
    expect(real.stderr).not.toBe("");
  });
});
