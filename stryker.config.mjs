// Mutation testing of the analysis engine: `npm run mutate` (long; never part of `npm test`).
// One file at a time: `npm run mutate -- --mutate app/analysis/voiceLeading.ts`.
// @ts-check
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: "vitest",
  vitest: { configFile: "vitest.mutation.config.ts", related: false },
  coverageAnalysis: "perTest",
  mutate: ["app/analysis/**/*.ts", "!app/analysis/types.ts", "!app/analysis/version.ts"],
  // Two cores are shared with the rest of the work on this machine.
  concurrency: 2,
  // Mutants that loop for ever (a search bound turned off) are cut short soon: each one counts as killed.
  timeoutMS: 4_000,
  reporters: ["html", "json", "clear-text", "progress"],
  htmlReporter: { fileName: "reports/mutation/index.html" },
  jsonReporter: { fileName: "reports/mutation/mutation.json" },
  incremental: true,
  incrementalFile: "reports/mutation/stryker-incremental.json",
  tempDirName: ".stryker-tmp",
  // Only what the engine's tests need is copied into the sandbox.
  ignorePatterns: ["/storage", "/build", "/playwright-report", "/test-results", "/reports", "/scratch-tmp", "/drizzle"],
  thresholds: { high: 90, low: 80, break: null },
};
