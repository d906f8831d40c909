// The engine's unit tests as StrykerJS runs them for `npm run mutate` (not part of `npm test`).
// Tests that read the engine's source text (purity) or run the CLI in a child process see the
// unmutated files, so they could only slow the run down without ever killing a mutant. The
// segmentation tests still being written stay out until they pass on the engine as it is: a
// mutation run refuses to start while any test fails. The worst-case suite times hang guards on
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
      "tests/unit/analysis/readingPlaying.test.ts",
      "tests/unit/analysis/textures.test.ts",
      "tests/unit/analysis/worstCase.test.ts",
    ],
    environment: "node",
    testTimeout: 20_000,
    hookTimeout: 30_000,
    pool: "forks",
  },
});
