import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          testTimeout: 30_000,
          hookTimeout: 60_000,
          // One shared database: files run one after another, each with its own users and crews.
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          // Load and fault tests: each file runs its own stack (tests/faults/harness.ts) and stops
          // parts of it, so they run after the other projects, one file at a time.
          name: "faults",
          include: ["tests/faults/**/*.test.ts"],
          setupFiles: ["tests/faults/setup-env.ts"],
          environment: "node",
          testTimeout: 20 * 60_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
