import { describe, expect, it } from "vitest";
import { reference } from "./references";

describe("reference", () => {
  it("pads the number to four digits after the letter", () => {
    expect(reference("F", 12)).toBe("F-0012");
    expect(reference("D", 7)).toBe("D-0007");
  });
  it("keeps every digit past four", () => {
    expect(reference("F", 12345)).toBe("F-12345");
  });
});
