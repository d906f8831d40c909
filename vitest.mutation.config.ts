// The engine's unit tests as StrykerJS runs them for `npm run mutate` (not part of `npm test`).
// Tests that read the engine's source text (purity) or run the CLI in a child process see the
// unmutated files, so they could only slow the run down without ever killing a mutant. The
// texture library (textures.test.ts) analyses dozens of whole takes per property, minutes per
// mutant, so it stays out; the worked examples of rules 15–22 (readingPlaying.test.ts) are in.
// The worst-case suite times hang guards on
// the largest accepted uploads (seconds per test, and a mutant only makes it slower): its limits
// are about time, not about what the engine answers.
import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/analysis/**/*.test.ts"],
    exclude: [
      "tests/unit/analysis/purity.test.ts",
      "tests/unit/analysis/cli.test.ts",
      "tests/unit/analysis/textures.test.ts",
      "tests/unit/analysis/worstCase.test.ts",
    ],
    environment: "node",
    testTimeout: 20_000,
    hookTimeout: 30_000,
    pool: "forks",
  },
});
