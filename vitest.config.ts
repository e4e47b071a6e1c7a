import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["test/**/*.test.ts"],
    setupFiles: ["test/setup/failOnConsole.ts"],
    testTimeout: 120_000,
    pool: "forks",
  },
});
