import { defineConfig } from "vitest/config";

/**
 * Two projects, chosen by file name (see DEVELOPERS.md, "Where a new test goes"):
 *  - `unit`: in-process tests that finish in seconds (the core, the CLI through `main(args, io)`,
 *    small property tests). `npm run test:fast` runs only these.
 *  - `slow`: tests that start processes (the built CLI, writers racing, pdftoppm, a browser) or
 *    generate thousands of inputs (fuzz). They need the built CLI, so only this project builds it.
 * `npm test` (and CI) runs both.
 */
export const SLOW = [
  "test/**/fuzz-*.test.ts",
  "test/**/*.fuzz.test.ts",
  "test/**/*.process.test.ts",
  "test/**/*.browser.test.ts",
  "test/cli.test.ts",
  "test/cli-io.test.ts",
  "test/logbook-concurrency.test.ts",
  "test/render.test.ts",
  "test/rank.test.ts", // these two start the built command (runCli)
  "test/series-plan.test.ts",
];

export default defineConfig({
  test: {
    testTimeout: 120_000,
    hookTimeout: 120_000,
    pool: "forks",
    setupFiles: ["test/helpers/setup.ts"],
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["test/**/*.test.ts"], exclude: SLOW },
      },
      {
        extends: true,
        test: { name: "slow", include: SLOW, globalSetup: ["test/helpers/global-setup.ts"] },
      },
    ],
  },
});
