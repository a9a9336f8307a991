import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    reporters: ["default", "./test/count-reporter.ts"],
    include: ["test/**/*.slow.test.ts"],
    testTimeout: 600_000,
  },
});
