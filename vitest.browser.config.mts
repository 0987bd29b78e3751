import path from "node:path";
import { defineConfig } from "vitest/config";

/** Browser tests: Debian chromium driven by playwright-core against `next start` on 127.0.0.1. */
export default defineConfig({
  resolve: { alias: { "@": path.resolve(import.meta.dirname) } },
  test: {
    environment: "node",
    include: ["tests/browser/**/*.test.ts"],
    globalSetup: ["tests/browser/global-setup.ts"],
    testTimeout: 90_000,
    hookTimeout: 600_000,
    fileParallelism: false,
    pool: "forks",
  },
});
