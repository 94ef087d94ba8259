import { describe, expect, it } from "vitest";
import { z } from "zod";
import { CONTROL_CHARACTERS_MESSAGE, hasControlCharacters, text } from "./text";

describe("the shared text schema", () => {
  it("refuses NUL, the other C0 controls, DEL and C1 controls, and keeps tab and line breaks", () => {
    for (const bad of ["a\u0000b", "\u0001", "x\u001b[31m", "\u007f", "\u0085", "\u000b"])
      expect(hasControlCharacters(bad), JSON.stringify(bad)).toBe(true);
    for (const good of ["Pour 3\tEast", "line one\nline two\r\n", "Grüße, 5 ½ in", "😀"])
      expect(hasControlCharacters(good), JSON.stringify(good)).toBe(false);
    const result = text().trim().max(20).safeParse("abc\u0000");
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe(CONTROL_CHARACTERS_MESSAGE);
  });

  // Every string field of every object schema in lib/schemas, found by walking the schemas: each
  // refuses a NUL with the message on that field. A new field written with z.string() fails here.
  const unwrap = (s: z.ZodType): z.ZodType => {
    let cur = s as z.ZodType & { def: { type: string; innerType?: z.ZodType; in?: z.ZodType } };
    for (let i = 0; i < 10; i++) {
      const def = cur.def;
      if (["optional", "nullable", "default", "prefault", "catch", "readonly"].includes(def.type) && def.innerType)
        cur = def.innerType as typeof cur;
      else if (def.type === "pipe" && def.in) cur = def.in as typeof cur;
      else break;
    }
    return cur;
  };
  const fields: [string, z.ZodObject, string][] = [];
  // Every schema module in this folder, so a new module is walked without being listed here.
  const modules = import.meta.glob<Record<string, unknown>>(["./*.ts", "!./*.test.ts"], { eager: true });
  for (const [file, exports] of Object.entries(modules)) {
    const mod = file.replace(/^\.\/|\.ts$/g, "");
    for (const [name, value] of Object.entries(exports)) {
      if (!(value instanceof z.ZodType)) continue;
      const objects: z.ZodObject[] = [];
      const base = unwrap(value);
      if (base instanceof z.ZodObject) objects.push(base);
      if (base instanceof z.ZodDiscriminatedUnion || base instanceof z.ZodUnion) {
        for (const option of base.options)
          if (unwrap(option as z.ZodType) instanceof z.ZodObject)
            objects.push(unwrap(option as z.ZodType) as z.ZodObject);
      }
      for (const object of objects) {
        for (const [key, field] of Object.entries(object.shape)) {
          if (unwrap(field as z.ZodType) instanceof z.ZodString) fields.push([`${mod}.${name}.${key}`, object, key]);
        }
      }
    }
  }

  it("finds the text fields to check", () => {
    expect(fields.length).toBeGreaterThan(25);
  });

  it.each(fields)("%s refuses a NUL with a message on that field", (_label, object, key) => {
    const result = object.safeParse({ [key]: "Level 2\u0000 east" });
    expect(result.success).toBe(false);
    const onField = result.error!.issues.filter((i) => i.path[0] === key).map((i) => i.message);
    // A field with a fixed format (an e-mail, a token, a code) refuses it with its own message.
    expect(onField.length, `no message on ${key}`).toBeGreaterThan(0);
  });
});
