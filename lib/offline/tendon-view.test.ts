import { describe, expect, it } from "vitest";
import type { FieldEvaluation, FieldFlag, FieldProject, FieldTendon } from "@/lib/schemas/sync";
import type { LocalRecord } from "./db";
import { fieldDay, fieldTime, tendonState } from "./tendon-view";

const tendon = { id: "t1", ends: "A" } as FieldTendon;

const record = (over: Partial<LocalRecord>): LocalRecord =>
  ({
    id: "r1",
    tendonEnd: "A",
    deviceTime: "2026-12-02T15:00:00.000Z",
    syncState: "synced",
    local: { verdict: "long", deviationPct: 9.1 },
    ...over,
  }) as LocalRecord;

const evaluation = (verdict: FieldEvaluation["verdict"]): FieldEvaluation => ({
  id: "e1",
  tendonId: "t1",
  verdict,
  provisional: false,
  deviationPct: verdict === "in band" ? 1.2 : 9.1,
  createdAt: "2026-12-02T15:01:00.000Z",
});

const flag = (status: string): FieldFlag => ({ id: "f1", tendonId: "t1", kind: "out_of_band", status });

describe("whether the tablet holds a tendon", () => {
  it("holds it on its own check before the server has judged the record", () => {
    expect(tendonState(tendon, [record({ syncState: "pending" })], [], undefined)).toBe("flagged");
  });

  it("holds it while a flag is open, whatever the verdicts", () => {
    expect(tendonState(tendon, [record({ local: null })], [flag("with_engineer")], evaluation("in band"))).toBe(
      "flagged",
    );
  });

  it("lets the server's verdict govern once it has judged: out of band, accepted by the engineer, is not held", () => {
    expect(tendonState(tendon, [record({})], [flag("closed")], evaluation("long"))).toBe("done");
  });

  it("holds a server verdict out of band whose flags have not arrived yet", () => {
    expect(tendonState(tendon, [record({})], [], evaluation("long"))).toBe("flagged");
  });

  it("does not hold a record the server judged in band although the tablet's own check said long", () => {
    expect(tendonState(tendon, [record({})], [], evaluation("in band"))).toBe("done");
  });

  it("holds again when a new record has not reached the server", () => {
    const restress = record({ id: "r2", deviceTime: "2026-12-02T16:00:00.000Z", syncState: "pending" });
    expect(tendonState(tendon, [record({}), restress], [flag("closed")], evaluation("long"))).toBe("flagged");
  });
});

describe("the day and time the tablet shows for a record, on the site's clock", () => {
  // 18:30 PST on 2026-12-02 is 02:30 UTC on 2026-12-03: America/Los_Angeles is UTC−8 in December
  // (IANA time zone database).
  const evening = "2026-12-03T02:30:00.000Z";
  const site = { timeZone: "America/Los_Angeles" };

  it("puts a record stressed at 18:30 in Los Angeles on that day, not the next", () => {
    expect(fieldDay(site as FieldProject, evening)).toBe("2026-12-02");
    expect(fieldTime(site, evening)).toBe("2026-12-02 18:30 PST");
  });

  it("follows the project's zone, whatever zone the tablet runs in", () => {
    expect(fieldTime({ timeZone: "America/Chicago" }, evening)).toBe("2026-12-02 20:30 CST");
    expect(fieldTime({ timeZone: "UTC" }, evening)).toBe("2026-12-03 02:30 UTC");
  });
});
