import { ESLint } from "eslint";
import { beforeAll, describe, expect, it } from "vitest";

// The project's own eslint.config.mjs, as `npx eslint .` reads it.
const eslint = new ESLint({ cwd: process.cwd() });

async function crossings(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result!.messages.filter((m) => m.ruleId === "import/no-restricted-paths").map((m) => m.message);
}

describe("the layers point one way", () => {
  // Loading the Next.js and TypeScript configs takes seconds on a busy machine; do it once, before the cases.
  beforeAll(async () => {
    await eslint.lintText("export {};\n", { filePath: "lib/elongation/example.ts" });
  }, 120_000);

  it("refuses the engine a domain union from lib/schemas, by alias or by path", async () => {
    expect(
      await crossings(
        `import { TENDON_ENDS } from "@/lib/schemas/domain";\nexport const e = TENDON_ENDS;\n`,
        "lib/elongation/example.ts",
      ),
    ).toEqual([expect.stringContaining("import nothing of the app")]);
    expect(
      await crossings(
        `import type { Verdict } from "../schemas/domain";\nexport type V = Verdict;\n`,
        "lib/elongation/example.ts",
      ),
    ).toEqual([expect.stringContaining("import nothing of the app")]);
  });

  it("lets lib/schemas take the engine's own lists, and db take lib/schemas", async () => {
    expect(
      await crossings(
        `import { STRESSED_ENDS } from "@/lib/elongation/types";\nexport const s = STRESSED_ENDS;\n`,
        "lib/schemas/example.ts",
      ),
    ).toEqual([]);
    expect(
      await crossings(
        `import type { TendonEnd } from "@/lib/schemas/domain";\nexport type E = TendonEnd;\n`,
        "db/example.ts",
      ),
    ).toEqual([]);
  });

  it("refuses db anything of lib but lib/schemas", async () => {
    expect(
      await crossings(
        `import { TENDON_ENDS } from "@/lib/elongation/types";\nexport const e = TENDON_ENDS;\n`,
        "db/example.ts",
      ),
    ).toEqual([expect.stringContaining("db re-uses lib/schemas only")]);
  });
});
