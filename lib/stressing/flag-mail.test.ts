import { describe, expect, it } from "vitest";
import { flagRecipientsNow } from "./flag-mail";

const project = { engineerOfRecordEmail: "eor@example.test", notifyEmails: ["pm@example.test", "eor@example.test"] };

describe("who gets a flag e-mail at once", () => {
  it("everyone on the project's list, once each, when nobody takes a digest", () => {
    expect(flagRecipientsNow(project, [], ["out_of_band"])).toEqual(["eor@example.test", "pm@example.test"]);
  });

  it("not the engineer who takes a digest, for a flag that can wait for the shift's end", () => {
    expect(flagRecipientsNow(project, ["EOR@example.test"], ["out_of_band", "seating_excess"])).toEqual([
      "pm@example.test",
    ]);
  });

  it("the digest reader too when one of the flags needs action before the shift ends", () => {
    for (const kind of ["cut_while_held", "member_wire_loss", "jacking_over_limit", "concrete_unconfirmed"])
      expect(flagRecipientsNow(project, ["eor@example.test"], ["out_of_band", kind])).toContain("eor@example.test");
  });

  it("nobody when the only address takes a digest", () => {
    expect(
      flagRecipientsNow(
        { engineerOfRecordEmail: "eor@example.test", notifyEmails: [] },
        ["eor@example.test"],
        ["out_of_band"],
      ),
    ).toEqual([]);
  });
});
