import { describe, expect, it } from "vitest";
import { placeFields, refusedWords } from "./field-errors";

describe("a refusal's field messages", () => {
  const boxOf = (path: string) => (path === "areaM2" ? "area" : path === "name" ? "name" : null);

  it("puts each message beside the box it belongs to and keeps the rest for above the form", () => {
    const placed = placeFields(
      {
        areaM2: ["The area must be above 0."],
        name: ["Give the pour a name."],
        level: ["Too long."],
        _: ["Odd body."],
      },
      boxOf,
    );
    expect(placed.boxes).toEqual({ area: ["The area must be above 0."], name: ["Give the pour a name."] });
    expect(placed.rest).toEqual(["Too long.", "Odd body."]);
  });

  it("does not repeat above the form what the boxes say", () => {
    const error = {
      message: "Check the form: The area must be above 0.",
      fields: { areaM2: ["The area must be above 0."] },
    };
    const words = refusedWords(error, placeFields(error.fields, boxOf));
    expect(words).toBe("Not saved: check the marked field.");
    expect(words).not.toContain("above 0");
  });

  it("says a message no box shows, and points at the marked boxes too", () => {
    const error = {
      message: "Check the form: Too high. Give the pour a name.",
      fields: { requiredConcreteMPa: ["Too high."], name: ["Give the pour a name."] },
    };
    expect(refusedWords(error, placeFields(error.fields, boxOf))).toBe(
      "Not saved: Too high. Check the marked fields too.",
    );
  });

  it("keeps the route's own words when the refusal names no field", () => {
    expect(refusedWords({ message: "No connection to the server." }, { boxes: {}, rest: [] })).toBe(
      "No connection to the server.",
    );
  });
});
