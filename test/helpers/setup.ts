// Property tests run with one fixed seed, so a CI run is repeatable; FC_SEED=random (or a number)
// explores other inputs locally, and a failure prints the seed and path that reproduce it.
import fc from "fast-check";

const env = process.env.FC_SEED;
const seed = env === "random" ? Date.now() ^ (Math.random() * 0x100000000) : env && /^-?\d+$/.test(env) ? Number(env) : 20261202;
fc.configureGlobal({ seed });

// armwind's cache (the logbook family index) goes to a temporary folder, never the user's ~/.cache
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

if (!process.env.ARMWIND_CACHE_DIR) process.env.ARMWIND_CACHE_DIR = mkdtempSync(join(tmpdir(), "armwind-test-cache-"));
