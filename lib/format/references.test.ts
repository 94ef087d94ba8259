import { describe, expect, it } from "vitest";
import { newFlagReference, reference } from "./references";

describe("reference", () => {
  it("pads the number to four digits after the letter", () => {
    expect(reference("F", 12)).toBe("F-0012");
    expect(reference("D", 7)).toBe("D-0007");
  });
  it("keeps every digit past four", () => {
    expect(reference("F", 12345)).toBe("F-12345");
  });
});

describe("newFlagReference", () => {
  it("numbers a flag after the project's existing ones", () => {
    expect(
      newFlagReference(11, [{ id: "5b8e0c1e-0000-4000-8000-000000000000" }], "5b8e0c1e-0000-4000-8000-000000000000"),
    ).toBe("F-0012");
  });
  it("numbers flags written together in the order of their ids, as the screens count them", () => {
    const together = [{ id: "f0000000-0000-4000-8000-000000000000" }, { id: "0a000000-0000-4000-8000-000000000000" }];
    expect(newFlagReference(4, together, "0a000000-0000-4000-8000-000000000000")).toBe("F-0005");
    expect(newFlagReference(4, together, "f0000000-0000-4000-8000-000000000000")).toBe("F-0006");
  });
});
