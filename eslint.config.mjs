import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";
import noUnitFactorLiteral from "./eslint/no-unit-factor-literal.mjs";

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
    // Unit factors live in lib/units only (tests included); display code formats through
    // lib/format/quantities. The rule and its reasoning: eslint/no-unit-factor-literal.mjs.
    plugins: { tautline: { rules: { "no-unit-factor-literal": noUnitFactorLiteral } } },
    ignores: ["lib/units/**", "eslint/**"],
    rules: { "tautline/no-unit-factor-literal": "error" },
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
