import { ESLint } from "eslint";
import { beforeAll, describe, expect, it } from "vitest";
import * as factors from "@/lib/units/factors";

// The project's own eslint.config.mjs, as `npx eslint .` reads it.
const eslint = new ESLint({ cwd: process.cwd() });

async function restricted(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result!.messages.filter((m) => m.ruleId === "no-restricted-imports").map((m) => m.message);
}

describe("unit factors stay out of screens and routes", () => {
  // Loading the Next.js and TypeScript configs takes seconds on a busy machine; do it once, before the cases.
  beforeAll(async () => {
    await eslint.lintText("export {};\n", { filePath: "components/setup/example.tsx" });
  }, 120_000);

  it.each(Object.keys(factors))("refuses importing %s from @/lib/units in components/", async (name) => {
    const messages = await restricted(
      `import { ${name} } from "@/lib/units";\nexport const used = ${name};\n`,
      "components/setup/example.tsx",
    );
    expect(messages).toEqual([expect.stringContaining("lib/format/quantities")]);
  });

  it("refuses a factor in app/ and the units' own files by path", async () => {
    expect(
      await restricted(
        `import { N_PER_KIP } from "@/lib/units";\nexport const k = N_PER_KIP;\n`,
        "app/(app)/example/page.tsx",
      ),
    ).toHaveLength(1);
    expect(
      await restricted(
        `import { mmToFt } from "@/lib/units/factors";\nexport const f = mmToFt;\n`,
        "components/field/example.tsx",
      ),
    ).toEqual([expect.stringContaining("not from its files")]);
  });

  it("lets screens parse and format through @/lib/units, and lib use the factors", async () => {
    expect(
      await restricted(
        `import { formatLength, parseLength } from "@/lib/units";\nexport const f = [formatLength, parseLength];\n`,
        "components/field/example.tsx",
      ),
    ).toEqual([]);
    expect(
      await restricted(
        `import { MM_PER_INCH } from "@/lib/units";\nexport const i = MM_PER_INCH;\n`,
        "lib/format/example.ts",
      ),
    ).toEqual([]);
  });
});
