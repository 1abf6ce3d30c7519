import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { alias: { "@": import.meta.dirname } },
  test: {
    include: ["test/unit/**/*.test.ts", "test/unit/**/*.test.tsx", "test/reference/**/*.test.ts"],
    environment: "node",
    pool: "forks",
    maxWorkers: 2,
    testTimeout: 30000,
    globalSetup: ["./test/setup/bundle.ts"],
    reporters: ["default", "./test/summary-reporter.ts"],
  },
});
