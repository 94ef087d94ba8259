import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [
      ".next/**",
      ".next-*/**",
      "node_modules/**",
      ".data/**",
      ".tmp/**",
      "public/sw.js",
      "test-results/**",
      "playwright-report/**",
      "next-env.d.ts",
    ],
  },
  {
    // Unit factors live in lib/units only; display code formats through lib/format/quantities.
    // Scoped to the folders already clean; widen it as the other screens move over.
    files: [
      "lib/format/**/*.ts",
      "lib/reports/**/*.ts",
      "lib/stressing/**/*.ts",
      "lib/server/**/*.ts",
      "components/reports/**/*.tsx",
    ],
    ignores: ["**/*.test.ts"],
    rules: {
      "no-restricted-syntax": [
        "error",
        {
          selector:
            "Literal[value=25.4], Literal[value=304.8], Literal[value=645.16], Literal[value=0.3048], Literal[value=6.894757293168], Literal[value=0.006894757293168], Literal[value=4.4482216152605], Literal[value=4448.2216152605]",
          message: "Unit factor literal: import it from lib/units (or format through lib/format/quantities).",
        },
      ],
    },
  },
  // The layers point one way: app → components → lib → db. The pure computation imports nothing of
  // the app, lib never reaches into components, server operations never into the HTTP transport.
  {
    rules: {
      "import/no-restricted-paths": [
        "error",
        {
          basePath: import.meta.dirname,
          zones: [
            {
              target: ["./lib", "./db"],
              from: ["./app", "./components"],
              message: "lib and db sit below app and components.",
            },
            { target: "./components", from: "./app", message: "components sit below app." },
            {
              target: ["./lib/elongation", "./lib/units"],
              from: ["./lib", "./db"],
              except: ["./elongation", "./units"],
              message: "The computation and the units are pure: they import nothing of the app.",
            },
            {
              target: "./lib/server",
              from: "./lib/http",
              message: "Server operations never import the HTTP transport.",
            },
            {
              target: "./db",
              from: "./lib",
              except: ["./schemas", "./env.ts"],
              message: "db re-uses lib/schemas only.",
            },
          ],
        },
      ],
    },
  },
  {
    files: ["db/migrations/**/*.ts", "db/migrate.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
];

export default config;
