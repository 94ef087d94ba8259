import { describe, expect, it } from "vitest";
import { signatureStanding } from "./signature-lines";

describe("where a report stands against its signatures, in one sentence", () => {
  it("says a report never signed is not signed yet", () => {
    expect(signatureStanding("The report of 2026-12-02", null, false)).toBe(
      "The report of 2026-12-02 is not signed yet.",
    );
  });

  it("names the revision that covers the content as it stands", () => {
    expect(signatureStanding("The report", 2, true)).toBe("The report as it stands is signed: revision 2.");
  });

  it("asks for a new signature when the content changed after the last signed revision", () => {
    expect(signatureStanding("The stressing report of L2 Pour 1", 3, false)).toBe(
      "The stressing report of L2 Pour 1 has changed since revision 3 was signed; it needs a new signature.",
    );
  });
});
