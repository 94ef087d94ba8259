import { describe, expect, it } from "vitest";
import { onReportDay, recordsOnDay, remarksOfSnapshot } from "./daily-rows";

// Chicago is UTC−6 in standard time and UTC−5 in daylight time (IANA tz database); in 2026 the
// clocks went back on 1 November at 02:00 CDT.

describe("the day a record belongs to, in the project's zone", () => {
  const records = [
    { id: "morning", deviceTime: new Date("2026-12-02T15:10:00Z") }, // 09:10 CST, 2 Dec
    { id: "evening", deviceTime: new Date("2026-12-03T01:30:00Z") }, // 19:30 CST, 2 Dec (3 Dec in UTC)
    { id: "last minute", deviceTime: new Date("2026-12-03T05:59:00Z") }, // 23:59 CST, 2 Dec
    { id: "midnight", deviceTime: new Date("2026-12-03T06:00:00Z") }, // 00:00 CST, 3 Dec
  ];

  it("puts an evening record in America/Chicago on that day, not on the next UTC day", () => {
    expect(recordsOnDay(records, "2026-12-02", "America/Chicago").map((r) => r.id)).toEqual([
      "morning",
      "evening",
      "last minute",
    ]);
    expect(recordsOnDay(records, "2026-12-03", "America/Chicago").map((r) => r.id)).toEqual(["midnight"]);
  });

  it("groups the same records by the UTC day on a project kept in UTC", () => {
    expect(recordsOnDay(records, "2026-12-02", "UTC").map((r) => r.id)).toEqual(["morning"]);
    expect(recordsOnDay(records, "2026-12-03", "UTC").map((r) => r.id)).toEqual(["evening", "last minute", "midnight"]);
  });

  it("follows the clock change: 00:30 CDT and 01:30 CST on 1 November both belong to that day", () => {
    expect(onReportDay(new Date("2026-11-01T05:30:00Z"), "2026-11-01", "America/Chicago")).toBe(true); // 00:30 CDT
    expect(onReportDay(new Date("2026-11-01T07:30:00Z"), "2026-11-01", "America/Chicago")).toBe(true); // 01:30 CST
    expect(onReportDay(new Date("2026-11-01T04:59:00Z"), "2026-11-01", "America/Chicago")).toBe(false); // 23:59 CDT, 31 Oct
  });
});

describe("the remarks a signed revision keeps", () => {
  it("reads back what was signed, and nothing when there were none", () => {
    expect(remarksOfSnapshot({ remarks: '"none"' })).toBe("none");
    expect(remarksOfSnapshot({ remarks: '"Barricades in place."' })).toBe("Barricades in place.");
    expect(remarksOfSnapshot({ remarks: "none" })).toBe("");
    expect(remarksOfSnapshot(undefined)).toBe("");
  });
});
