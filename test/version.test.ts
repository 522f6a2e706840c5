/** The version printed by --version and on every card's footer is package.json's (src/version.ts says it is kept in step). */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { VERSION } from "../src/version.js";
import { ROOT, runMain } from "./helpers/cli.js";

describe("version", () => {
  it("is package.json's, and --version prints it", async () => {
    const pkg = JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as { version: string };
    expect(VERSION).toBe(pkg.version);
    expect((await runMain(["--version"])).stdout.trim()).toBe(pkg.version);
  });
});
