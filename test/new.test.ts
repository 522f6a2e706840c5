/** `armwind new` and the job-file templates it copies (src/cli/new.ts, templates/*.yaml). */
import { existsSync } from "node:fs";
import { resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { ArmwindError } from "../src/errors.js";
import { loadYaml } from "../src/job/load.js";
import { jobSchema } from "../src/job/schema.js";
import { planJob } from "../src/design/plan.js";
import { planStatus } from "../src/cli/plan.js";
import { STYLES, templateText, writeNew } from "../src/cli/new.js";
import { main } from "../src/cli/main.js";
import type { Io } from "../src/cli/io.js";

const ROOT = join(import.meta.dirname, "..");
const raw = (style: string) => readFileSync(join(ROOT, "templates", `${style}.yaml`), "utf8");

function fakeIo(cwd: string, env: NodeJS.ProcessEnv = {}): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { out: (s) => stdout.push(s), err: (s) => stderr.push(s), stdin: () => "", env, cwd, stdout, stderr };
}
const tmp = () => mkdtempSync(join(tmpdir(), "armwind-new-"));

describe.each(STYLES)("templates/%s.yaml", (style) => {
  it("with its id filled in, loads, validates and plans with status 0 or 2, never bad input", () => {
    for (const id of ["rewind-0001", "123", "1e5", "true", "A.b_c-9"]) {
      const text = templateText(style, id);
      let status: number;
      try {
        const { value: job } = loadYaml(text, `${id}.yaml`, jobSchema);
        expect(job.id).toBe(id); // "123" and "true" are quoted so that YAML keeps them text
        expect(job.winding.style).toBe(style);
        status = planStatus(planJob(job));
      } catch (e) {
        if (e instanceof ArmwindError)
          expect.fail(`template ${style} with id ${id}: ${e.problems.map((p) => `${p.line}:${p.column} ${p.path} ${p.message}`).join(" | ")}`);
        throw e;
      }
      expect([0, 2]).toContain(status);
    }
  });

  it("comments every field", () => {
    const lines = raw(style).split("\n");
    const uncommented = lines.filter((l) => /^\s*(- )?[$a-z_]+:/.test(l) && !l.includes("#"));
    expect(uncommented).toEqual([]);
  });

  it("marks its values as examples to be replaced", () => {
    const t = raw(style);
    expect(t).toMatch(/EVERY VALUE BELOW IS AN EXAMPLE TO BE REPLACED/);
    expect(t).toMatch(/^id: example-/m);
    expect(t).toMatch(/^title: EXAMPLE /m);
  });

  it("opens with the order to record things while stripping, before anything is cut", () => {
    const head = raw(style).split("\nversion:")[0];
    const steps = [
      /Photograph/,
      /Mark slot 1/,
      /Lead throw/,
      /Span/,
      /Coils per slot/,
      style === "tooth" ? /Direction/ : /Progression/,
      /Turns per coil: count them while unwinding/,
      /micrometer/,
      /Keep ALL the old wire: weigh it/,
    ];
    let at = -1;
    for (const s of steps) {
      const i = head.search(s);
      expect(i, String(s)).toBeGreaterThan(at);
      at = i;
    }
    expect(head).toMatch(/BEFORE ANYTHING IS CUT/);
    expect(head).toMatch(/lead throw \(which|centre line/);
    // stripping enamel and running the motor on the bench can hurt: the usual cautions
    expect(head).toMatch(/CAUTION: burning enamel off gives harmful fumes/);
    expect(head).toMatch(/CAUTION: keep fingers, hair and sleeves clear of the turning shaft/);
  });

  it("names the tool for each measurement", () => {
    const t = raw(style);
    for (const tool of ["calipers", "micrometer", "feeler gauges", "unwinding", "tachometer", "scale", "tape measure"]) expect(t, tool).toContain(tool);
    expect(t).toMatch(/four-wire|ohmmeter/);
  });
});

it("the lap template, a universal motor on the mains, carries the mains and series-motor cautions", () => {
  const t = raw("lap");
  expect(t).toMatch(/CAUTION \(mains\)/);
  expect(t).toMatch(/must never run unloaded/);
});

describe("armwind new", () => {
  it("writes <id>.yaml in the working folder: the template with the id", async () => {
    const dir = tmp();
    const io = fakeIo(dir);
    expect(await main(["new", "--style", "lap", "--id", "mixer-0007"], io)).toBe(0);
    const text = readFileSync(join(dir, "mixer-0007.yaml"), "utf8");
    // the template, with its $schema pointing at the real schema file from where the job was written
    expect(text.split("\n").slice(1).join("\n")).toBe(templateText("lap", "mixer-0007").split("\n").slice(1).join("\n"));
    expect(existsSync(resolve(dir, /\$schema=(\S+)/.exec(text)![1]))).toBe(true);
    expect(text).toMatch(/^id: mixer-0007 /m);
    expect(io.stdout.join("\n")).toMatch(/job file written: mixer-0007\.yaml/);
    expect(readdirSync(dir)).toEqual(["mixer-0007.yaml"]); // no temporary file left behind
  });

  it("refuses to overwrite: exit 3, one clear line, the file untouched", async () => {
    const dir = tmp();
    writeFileSync(join(dir, "job-1.yaml"), "my measurements\n");
    const io = fakeIo(dir);
    expect(await main(["new", "--style", "tooth", "--id", "job-1"], io)).toBe(3);
    expect(io.stderr).toHaveLength(1);
    expect(io.stderr[0]).toBe("job-1.yaml: already exists; armwind new never overwrites a file: choose another name with -o FILE or --id ID [file_exists]");
    expect(readFileSync(join(dir, "job-1.yaml"), "utf8")).toBe("my measurements\n");
    expect(readdirSync(dir)).toEqual(["job-1.yaml"]);
  });

  it("writeNew never replaces: the second writer of a name fails", () => {
    const f = join(tmp(), "a.yaml");
    writeNew(f, "first");
    expect(() => writeNew(f, "second")).toThrow(/already exists/);
    expect(readFileSync(f, "utf8")).toBe("first");
  });

  it("the default id is rewind-<date> (SOURCE_DATE_EPOCH fixes the date)", async () => {
    const dir = tmp();
    const io = fakeIo(dir, { SOURCE_DATE_EPOCH: "1764547200" }); // 2025-12-01T00:00:00Z
    expect(await main(["new", "--style", "wave", "--json"], io)).toBe(0);
    const out = JSON.parse(io.stdout.join(""));
    expect(out).toEqual({ ok: true, errors: [], file: join(dir, "rewind-2025-12-01.yaml"), id: "rewind-2025-12-01", style: "wave" });
    expect(loadYaml(readFileSync(out.file, "utf8"), "x", jobSchema).value.id).toBe("rewind-2025-12-01");
  });

  it("-o FILE names the file; -o DIR/ puts <id>.yaml in it, creating the folder", async () => {
    const dir = tmp();
    expect(await main(["new", "--style", "tooth", "--id", "t1", "-o", "a/b/custom.yml"], fakeIo(dir))).toBe(0);
    expect(readFileSync(join(dir, "a/b/custom.yml"), "utf8")).toMatch(/^id: t1 /m);
    expect(await main(["new", "--style", "tooth", "--id", "t2", "-o", "jobs/"], fakeIo(dir))).toBe(0);
    expect(readFileSync(join(dir, "jobs/t2.yaml"), "utf8")).toMatch(/^id: t2 /m);
    expect(await main(["new", "--style", "tooth", "--id", "t3", "-o", "jobs"], fakeIo(dir))).toBe(0); // an existing folder
    expect(readFileSync(join(dir, "jobs/t3.yaml"), "utf8")).toMatch(/^id: t3 /m);
  });

  it("a path under a regular file: exit 3, write_failed", async () => {
    const dir = tmp();
    writeFileSync(join(dir, "plain"), "x");
    const io = fakeIo(dir);
    expect(await main(["new", "--style", "tooth", "--id", "t1", "-o", "plain/t1.yaml", "--json"], io)).toBe(3);
    expect(io.stderr[0]).toMatch(/^plain\/t1\.yaml: cannot be written: a file stands where a folder is needed; .* \[write_failed\]$/);
    const out = JSON.parse(io.stdout.join(""));
    expect(out.ok).toBe(false);
    expect(out.errors[0]).toMatchObject({ code: "write_failed", file: "plain/t1.yaml", path: "" });
  });

  it("an id that cannot name a file: exit 1, bad_id, nothing written", async () => {
    const dir = tmp();
    const io = fakeIo(dir);
    expect(await main(["new", "--style", "tooth", "--id", "../escape"], io)).toBe(1);
    expect(io.stderr).toHaveLength(1);
    expect(io.stderr[0]).toMatch(/^id: --id "\.\.\/escape" must be letters, digits.* \[bad_id\]$/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it("a missing or unknown --style: exit 1 from the command line, nothing written", async () => {
    const dir = tmp();
    const io = fakeIo(dir);
    expect(await main(["new"], io)).toBe(1);
    expect(io.stderr.join("")).toMatch(/style/);
    const io2 = fakeIo(dir);
    expect(await main(["new", "--style", "lapp"], io2)).toBe(1);
    expect(io2.stderr.join("")).toMatch(/lapp/);
    expect(readdirSync(dir)).toEqual([]);
  });
});
