import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [".next/**", ".next-*/**", "node_modules/**", ".data/**", ".tmp/**", "public/sw.js", "test-results/**", "playwright-report/**", "next-env.d.ts"],
  },
  {
    files: ["db/migrations/**/*.ts", "db/migrate.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
];

export default config;
