import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";
import { readFileSync } from "node:fs";
import noUnitFactorLiteral from "./eslint/no-unit-factor-literal.mjs";

/**
 * Every export of lib/units/factors.ts (the factors and the conversions built on them) and the unit
 * tables that carry them: read from the file, so a factor added there is refused here too.
 */
const UNIT_FACTOR_EXPORTS = [
  ...readFileSync(new URL("./lib/units/factors.ts", import.meta.url), "utf8").matchAll(/^export const (\w+)/gm),
].map((m) => m[1]);

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
  {
    // Screens and routes show quantities through lib/format/quantities (and fill form boxes through
    // lib/client/unit-fields), never with a factor of their own: what the literal rule cannot see.
    files: ["app/**/*.{ts,tsx}", "components/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          paths: [
            {
              name: "@/lib/units",
              importNames: [...UNIT_FACTOR_EXPORTS, "LENGTH_UNITS", "PRESSURE_UNITS", "FORCE_UNITS"],
              message:
                "Show a quantity through lib/format/quantities (showLength, showForce, inDisplayUnit …) or fill a form box through PER and shown() of lib/client/unit-fields.",
            },
          ],
          patterns: [
            {
              group: ["@/lib/units/*"],
              message: "Import from @/lib/units (parsing and formatting), not from its files.",
            },
          ],
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
