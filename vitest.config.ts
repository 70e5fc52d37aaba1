import { defineConfig } from "vitest/config";

// Three projects so `npm test` can run them in order and each can be run alone.
// Integration and e2e share one PostgreSQL cluster started by tests/setup/global-setup.ts.
export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["app/**/*.test.ts", "app/**/*.test.tsx", "scripts/**/*.test.ts"], environment: "node" },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          globalSetup: ["tests/setup/global-setup.ts"],
          setupFiles: ["tests/setup/integration-env.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          globalSetup: ["tests/setup/global-setup.ts", "tests/setup/e2e-server.ts"],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
