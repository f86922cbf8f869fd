import { defineConfig } from "vitest/config";

// Browser tests: Playwright (playwright-core) driving Debian's /usr/bin/chromium against dist/.
export default defineConfig({
  test: {
    include: ["test/e2e/**/*.e2e.ts"],
    testTimeout: 120000,
    hookTimeout: 120000,
    fileParallelism: false,
  },
});
