import { defineConfig } from "vitest/config";
import path from "node:path";

export default defineConfig({
  resolve: { alias: { "@": path.resolve(__dirname) } },
  test: {
    include: ["test/unit/**/*.test.ts", "test/unit/**/*.test.tsx", "test/reference/**/*.test.ts"],
    environment: "node",
    pool: "forks",
    maxWorkers: 2,
    testTimeout: 30000,
    reporters: ["default", "./test/summary-reporter.ts"],
  },
});
