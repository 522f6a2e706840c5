// Build the CLI once (tsc → dist/) so that CLI tests run the real command as `node dist/cli/main.js`.
import { execFileSync } from "node:child_process";

export default function setup(): void {
  execFileSync(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "tsconfig.build.json"], { stdio: "inherit" });
}
