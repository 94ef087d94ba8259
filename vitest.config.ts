import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      "@": root,
      "server-only": `${root}tests/support/empty-module.ts`,
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["lib/**/*.test.ts", "tests/reference/**/*.test.ts", "eslint/**/*.test.ts"],
          environment: "node",
          // A unit test failed once in CI and never here; a retry keeps one bad draw from hiding a
          // whole run, and `npm test` names any test that needed it at the end of its output.
          retry: 2,
        },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
          server: { deps: { inline: ["kysely"] } },
        },
      },
    ],
  },
});
