/** Paper cuts that need the built command (its --help ends the process): issue 11. */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { ROOT, runCli } from "./helpers/cli.js";

describe("paper cuts (process)", () => {
  it("plan --help does not send a reader to DESIGN.md, which a clone does not hold", async () => {
    const r = runCli(["plan", "--help"]);
    const help = r.stdout + r.stderr;
    expect(help).toMatch(/--json/);
    expect(help).not.toMatch(/DESIGN\.md/);
    // and the README holds what it points to
    expect(readFileSync(join(ROOT, "README.md"), "utf8")).toMatch(/### The plan --json output/);
  });
});
