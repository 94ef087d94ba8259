import { describe, expect, it } from "vitest";
import { describeChanges } from "./report-changes";

describe("describeChanges", () => {
  const before = {
    release: "not released",
    "record S-01 end A stressing 1": "revision 1, 4 1/4 in at 4150 psi, short",
    "flag F-0001 (S-01)": "open",
  };

  it("says nothing for the first revision and for an unchanged report", () => {
    expect(describeChanges(null, before)).toEqual([]);
    expect(describeChanges(before, { ...before })).toEqual([]);
  });

  it("names what was added, what changed and what went away", () => {
    const after = {
      release: "released by Priya Raman, P.E.",
      "record S-01 end A stressing 1": "revision 2, 4 3/8 in at 4150 psi, short",
      "record S-01 end A stressing 2": "revision 1, 5 in at 4230 psi, in band",
    };
    expect(describeChanges(before, after)).toEqual([
      "flag F-0001 (S-01): no longer in the report (was open)",
      "record S-01 end A stressing 1: revision 1, 4 1/4 in at 4150 psi, short → revision 2, 4 3/8 in at 4150 psi, short",
      "record S-01 end A stressing 2: added (revision 1, 5 in at 4230 psi, in band)",
      "release: not released → released by Priya Raman, P.E.",
    ]);
  });
});
