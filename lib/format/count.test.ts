import { describe, expect, it } from "vitest";
import { countOf } from "./count";

describe("countOf", () => {
  it("writes one thing in the singular and any other count in the plural", () => {
    expect(countOf(1, "tendon")).toBe("1 tendon");
    expect(countOf(0, "tendon")).toBe("0 tendons");
    expect(countOf(50, "tendon")).toBe("50 tendons");
    expect(countOf(1, "equipment set")).toBe("1 equipment set");
  });
  it("takes an irregular plural", () => {
    expect(countOf(2, "strand lot", "strand lots")).toBe("2 strand lots");
    expect(countOf(3, "person", "people")).toBe("3 people");
  });
});
