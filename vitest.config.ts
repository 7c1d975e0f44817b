import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));
// Integration tests get a database of their own beside the run's test database, recreated per run.
const integrationDb = `${process.env.DB_NAME ?? "yawpoint_test"}_it`;

export default defineConfig({
  resolve: { alias: { "@": root } },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["lib/**/*.test.ts", "experiments/**/*.test.ts", "tests/unit/**/*.test.ts"],
          environment: "node",
        },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          globalSetup: ["tests/integration/global-setup.ts"],
          env: { DB_NAME: integrationDb },
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
