import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    // tests/reliability start their own app instances (and a MariaDB of their own) from the
    // build scripts/test makes; they run on every scripts/test.
    include: ["tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts", "tests/reliability/**/*.test.ts"],
    environment: "node",
    testTimeout: 60_000,
    hookTimeout: 60_000,
    // Integration files share one database: run files one at a time.
    fileParallelism: false,
  },
});
