import { describe, expect, it } from "vitest";
import { z } from "zod";
import { zodFields } from "./zod-fields";

describe("zodFields", () => {
  const schema = z.strictObject({ name: z.string(), points: z.array(z.strictObject({ forceN: z.number() })) });

  it("names an unknown field itself, nested ones by their path", () => {
    const result = schema.safeParse({ name: "A", colour: "red", points: [{ forceN: 1, unit: "kip" }] });
    expect(result.success).toBe(false);
    const fields = zodFields(result.error!);
    expect(Object.keys(fields).sort()).toEqual(["colour", "points.0.unit"]);
    expect(fields.colour).toEqual(['Unknown field "colour": this form has no such field.']);
  });

  it("keeps a sender's __proto__ or constructor as a plain own field", () => {
    const body = JSON.parse('{"name":"A","points":[],"__proto__":{"admin":true},"constructor":1}') as unknown;
    const fields = zodFields(schema.safeParse(body).error!);
    expect(Object.keys(fields).sort()).toEqual(["__proto__", "constructor"]);
    // Sent back as JSON, the answer names it like any other field.
    expect(JSON.stringify(fields)).toContain(
      '"__proto__":["Unknown field \\"__proto__\\": this form has no such field."]',
    );
    expect(({} as Record<string, unknown>).admin).toBeUndefined();
  });

  it("puts a fault of the whole body under _ and others under their field", () => {
    const fields = zodFields(schema.safeParse({ name: 3, points: [] }).error!);
    expect(Object.keys(fields)).toEqual(["name"]);
    expect(zodFields(schema.safeParse(null).error!)).toHaveProperty("_");
  });
});
