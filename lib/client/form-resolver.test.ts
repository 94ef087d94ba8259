import { describe, expect, it } from "vitest";
import { z } from "zod";
import { units } from "@/lib/client/unit-fields";
import { pourSchema } from "@/lib/schemas/pour";
import { formResolver } from "./form-resolver";

const resolver = formResolver(
  { name: z.string(), level: z.string(), area: units.number(false), plannedStressingDate: z.string() },
  ({ area, ...v }) => ({
    ...v,
    level: v.level || null,
    plannedStressingDate: v.plannedStressingDate || null,
    areaM2: area,
  }),
  pourSchema,
  { areaM2: "area" },
);
const run = (values: Record<string, string>) =>
  resolver({ name: "L3 east", level: "", area: "", plannedStressingDate: "", ...values } as never, undefined, {
    fields: {},
    shouldUseNativeValidation: false,
  });

describe("a form resolver that tells every fault at once", () => {
  it("puts the SI schema's complaint about a negative area beside the area box", async () => {
    const { errors, values } = await run({ area: "-500" });
    expect(errors).toEqual({ area: { type: "invalid", message: "The area must be above 0." } });
    expect(values).toEqual({});
  });

  it("reports an unreadable box and a fault the SI schema finds in another box together", async () => {
    const { errors } = await run({ name: " ", area: "lots", plannedStressingDate: "next week" });
    expect(Object.keys(errors).sort()).toEqual(["area", "name", "plannedStressingDate"]);
    expect(errors.area?.message).toBe("Type a number.");
    expect(errors.name?.message).toMatch(/name/);
  });

  it("sends a message no box owns to the form itself", async () => {
    // The pour form has no status box: a status that reaches the shared schema anyway is refused on the form.
    const setsStatus = formResolver(
      { name: z.string() },
      (v) => ({ name: v.name, level: null, areaM2: null, plannedStressingDate: null, status: "released" }),
      pourSchema,
    );
    const refused = await setsStatus({ name: "L3 east" }, undefined, { fields: {}, shouldUseNativeValidation: false });
    expect(refused.errors).toEqual({
      root: { type: "invalid", message: "A pour's status follows from its records and its release; it cannot be set." },
    });
    const loose = formResolver(
      { a: z.string() },
      () => ({ b: 1 }),
      z.object({ b: z.string({ error: "B is missing." }) }),
    );
    const out = await loose({ a: "x" }, undefined, { fields: {}, shouldUseNativeValidation: false });
    expect(out.errors).toEqual({ root: { type: "invalid", message: "B is missing." } });
  });

  it("answers the SI values when every box reads", async () => {
    const { errors, values } = await run({ area: "1,250", plannedStressingDate: "2026-12-09" });
    expect(errors).toEqual({});
    expect(values).toEqual({ name: "L3 east", level: null, areaM2: 1250, plannedStressingDate: "2026-12-09" });
  });
});

describe("rows of a list box", () => {
  it("names the row at fault, whether the box or the SI schema finds it", async () => {
    const resolve = formResolver(
      { segments: z.array(z.object({ length: units.length("US", "ft", false) })) },
      ({ segments }) => ({ segments: (segments ?? []).map((s) => ({ lengthMm: s.length })) }),
      z.object({
        segments: z.array(
          z.object({ lengthMm: z.number({ error: "Give the length." }).positive("Give a length above 0.") }),
        ),
      }),
      {},
      { segments: "Segment" },
    );
    const options = { fields: {}, shouldUseNativeValidation: false };
    const unreadable = await resolve({ segments: [{ length: "15" }, { length: "fifteen" }] }, undefined, options);
    expect(unreadable.errors.segments?.message).toMatch(/^Segment 2: /);
    const empty = await resolve({ segments: [{ length: "15" }, { length: "" }] }, undefined, options);
    expect(empty.errors.segments?.message).toBe("Segment 2: Give the length.");
  });
});
