import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    reporters: ["default", "./test/count-reporter.ts"],
    include: ["test/**/*.test.ts"],
    exclude: ["test/**/*.slow.test.ts", "node_modules/**"],
    testTimeout: 60_000,
  },
});
