import { defineConfig } from "vitest/config";

// When OVERASK_TEST_REPORT names a file (CI sets it), vitest also writes its JSON report there, from
// which .ci/run prints the closing "N passed, N failed" line.
const report = process.env.OVERASK_TEST_REPORT;

export default defineConfig({
  test: {
    include: ["test/**/*.test.ts"],
    testTimeout: 30_000,
    reporters: report ? ["default", ["json", { outputFile: report }]] : ["default"],
  },
});
