/** Paper cuts a newcomer hit (issue 11): each one reproduced as it was met, through the real command line in-process. */
import { describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { main } from "../src/cli/main.js";
import { ROOT } from "./helpers/cli.js";
import { fakeIo } from "./helpers/io.js";

const BLIND = join(ROOT, "jobs/blind-motor-0031.yaml");
const tmp = () => mkdtempSync(join(tmpdir(), "armwind-cuts-"));

describe("paper cuts", () => {
  it("card -o toy.pdf writes the card to toy.pdf (not a folder named toy.pdf), the curves beside it", async () => {
    const dir = tmp();
    const io = fakeIo(dir);
    expect(await main(["card", BLIND, "--no-learn", "-o", "toy.pdf"], io)).toBe(0);
    expect(statSync(join(dir, "toy.pdf")).isFile()).toBe(true);
    expect(readFileSync(join(dir, "toy.pdf")).subarray(0, 5).toString()).toBe("%PDF-");
    expect(existsSync(join(dir, "toy-curves.svg"))).toBe(true);
    // a folder is still a folder
    const io2 = fakeIo(dir);
    expect(await main(["card", BLIND, "--no-learn", "-o", "cards"], io2)).toBe(0);
    expect(existsSync(join(dir, "cards", "blind-motor-0031.pdf"))).toBe(true);
  });
  it("the README says how to run armwind as a command", () => {
    const readme = readFileSync(join(ROOT, "README.md"), "utf8");
    expect(readme).toMatch(/npx armwind/);
    expect(readme).toMatch(/npm link/);
  });
  it("with no command the hint is printed once", async () => {
    const io = fakeIo(ROOT);
    expect(await main([], io)).toBe(1);
    const err = io.stderr.join("");
    expect(err.match(/--help/g)).toHaveLength(1);
  });
  it("speed: 11,000 rpm inside { } gets a hint about the comma", async () => {
    const dir = tmp();
    const text = readFileSync(BLIND, "utf8").replace(/no_load_speed: 9800 rpm/, "no_load_speed: 11,000 rpm");
    expect(text).toMatch(/11,000/);
    writeFileSync(join(dir, "job.yaml"), text);
    const io = fakeIo(dir);
    expect(await main(["check", "job.yaml"], io)).toBe(1);
    expect(io.stderr.join("")).toMatch(/job\.yaml:\d+:\d+: .*"000 rpm".*comma.*11000 rpm/);
  });
});
