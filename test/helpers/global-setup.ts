// Build once (scripts/build.mjs: tsc → dist/, the CLI bundle dist/armwind.cjs and its code cache) so that
// process-level tests run the real command as installed: `node bin/armwind.mjs`.
import { execFileSync } from "node:child_process";

export default function setup(): void {
  execFileSync(process.execPath, ["scripts/build.mjs"], { stdio: "inherit" });
}
