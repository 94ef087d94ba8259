import { describe, expect, it } from "vitest";
import { dispositionFromRow, type DispositionRow } from "./disposition";
import { flagFromRow, type FlagRow } from "./flag";
import { fieldFlagFrom, fieldFlagSchema } from "./sync-response";

const flagRow: FlagRow = {
  id: "f1",
  number: 12,
  project_id: "p1",
  pour_id: "o1",
  tendon_id: "t1",
  record_id: "r1",
  evaluation_id: "e1",
  kind: "out_of_band",
  reason: "Elongation 9 % long.",
  status: "closed",
  created_at: new Date("2026-12-02T09:10:00Z"),
  closed_at: "2026-12-03T14:00:00+00:00",
  closed_by: "u2",
  close_reason: "Paperwork: remeasured",
};

const dispositionRow: DispositionRow = {
  id: "d1",
  number: 7,
  project_id: "p1",
  flag_id: "f1",
  tendon_id: "t1",
  decision: "accept",
  reasons: "Within the member's capacity.",
  engineer_user_id: "u3",
  engineer_name: "Engineer Three",
  licence_statement: "PE 12345",
  created_at: "2026-12-03T13:00:00+00:00",
};

describe("flagFromRow", () => {
  it("names every column in the DTO's words, with its reference and instants as ISO text", () => {
    expect(flagFromRow(flagRow)).toEqual({
      id: "f1",
      reference: "F-0012",
      projectId: "p1",
      pourId: "o1",
      tendonId: "t1",
      recordId: "r1",
      evaluationId: "e1",
      kind: "out_of_band",
      reason: "Elongation 9 % long.",
      status: "closed",
      createdAt: "2026-12-02T09:10:00.000Z",
      closedAt: "2026-12-03T14:00:00.000Z",
      closedBy: "u2",
      closeReason: "Paperwork: remeasured",
    });
    expect(flagFromRow({ ...flagRow, status: "open", closed_at: null, closed_by: null }).closedAt).toBeNull();
  });
});

describe("dispositionFromRow", () => {
  it("names every column in the DTO's words, with its reference and the instant as ISO text", () => {
    expect(dispositionFromRow({ ...dispositionRow, created_at: new Date("2026-12-03T13:00:00Z") })).toEqual({
      id: "d1",
      reference: "D-0007",
      projectId: "p1",
      flagId: "f1",
      tendonId: "t1",
      decision: "accept",
      reasons: "Within the member's capacity.",
      engineerUserId: "u3",
      engineerName: "Engineer Three",
      licenceStatement: "PE 12345",
      createdAt: "2026-12-03T13:00:00.000Z",
    });
  });
});

describe("the pull's flag", () => {
  it("carries the flag with its dispositions, and the contract keeps only what the tablet stores", () => {
    const sent = fieldFlagSchema.parse(fieldFlagFrom(flagFromRow(flagRow), [dispositionFromRow(dispositionRow)]));
    expect(sent).toEqual({
      id: "f1",
      tendonId: "t1",
      kind: "out_of_band",
      status: "closed",
      reason: "Elongation 9 % long.",
      createdAt: "2026-12-02T09:10:00.000Z",
      dispositions: [
        {
          id: "d1",
          decision: "accept",
          reasons: "Within the member's capacity.",
          engineerName: "Engineer Three",
          createdAt: "2026-12-03T13:00:00.000Z",
        },
      ],
    });
  });
});
