import { defineConfig } from "vitest/config";
import path from "node:path";

export default defineConfig({
  resolve: { alias: { "@": path.resolve(__dirname) } },
  test: {
    environment: "node",
    include: ["tests/**/*.test.ts"],
    exclude: ["tests/e2e/**", "node_modules/**"],
    setupFiles: ["tests/setup/env.ts"],
    globalSetup: ["vitest.global-setup.ts"],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    // DB-backed suites share one test database: run files one at a time.
    fileParallelism: false,
  },
});
