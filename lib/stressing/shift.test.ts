import { describe, expect, it } from "vitest";
import { formatShiftEnd, lastEndedShift, nextShiftEnd, parseShiftEnds } from "./shift";

// Offsets from the IANA time zone database: America/Chicago is UTC−6 (CST) in winter and UTC−5
// (CDT) in summer; US daylight time runs from the second Sunday of March to the first Sunday of
// November (15 U.S.C. §260a), so 2026-03-08 has 23 hours and 2026-11-01 has 25 in Chicago.
const CHICAGO = "America/Chicago";
const iso = (d: Date) => d.toISOString();

describe("the project's shifts", () => {
  it("with one end at 18:00, the shift that ended last runs from yesterday's 18:00 to today's", () => {
    // 2026-12-02 19:30 CST is 2026-12-03 01:30 UTC.
    const w = lastEndedShift(new Date("2026-12-03T01:30:00Z"), CHICAGO, [1080]);
    expect(iso(w.end)).toBe("2026-12-03T00:00:00.000Z");
    expect(iso(w.start)).toBe("2026-12-02T00:00:00.000Z");
  });

  it("before today's end, the last ended shift is yesterday's", () => {
    // 2026-12-02 17:59 CST: today's 18:00 has not come.
    const w = lastEndedShift(new Date("2026-12-02T23:59:00Z"), CHICAGO, [1080]);
    expect(iso(w.end)).toBe("2026-12-02T00:00:00.000Z");
  });

  it("counts the end itself as ended (a dispatcher that wakes at 18:00:00 sends)", () => {
    expect(iso(lastEndedShift(new Date("2026-12-03T00:00:00Z"), CHICAGO, [1080]).end)).toBe("2026-12-03T00:00:00.000Z");
  });

  it("with two ends a day, a day shift and a night shift", () => {
    const ends = [360, 1080];
    // 2026-12-02 12:00 CST: the night shift from 18:00 yesterday ended at 06:00 today.
    const w = lastEndedShift(new Date("2026-12-02T18:00:00Z"), CHICAGO, ends);
    expect(iso(w.start)).toBe("2026-12-02T00:00:00.000Z");
    expect(iso(w.end)).toBe("2026-12-02T12:00:00.000Z");
    expect(iso(nextShiftEnd(new Date("2026-12-02T18:00:00Z"), CHICAGO, ends))).toBe("2026-12-03T00:00:00.000Z");
  });

  it("keeps the local end time across daylight saving: the shift over the spring change is 23 hours", () => {
    // 2026-03-08 18:00 CDT is 23:00 UTC; 2026-03-07 18:00 CST is 2026-03-08 00:00 UTC.
    const w = lastEndedShift(new Date("2026-03-09T01:00:00Z"), CHICAGO, [1080]);
    expect(iso(w.end)).toBe("2026-03-08T23:00:00.000Z");
    expect(iso(w.start)).toBe("2026-03-08T00:00:00.000Z");
    expect((+w.end - +w.start) / 3_600_000).toBe(23);
  });

  it("and the shift over the autumn change is 25 hours", () => {
    const w = lastEndedShift(new Date("2026-11-02T01:00:00Z"), CHICAGO, [1080]);
    expect(iso(w.end)).toBe("2026-11-02T00:00:00.000Z");
    expect((+w.end - +w.start) / 3_600_000).toBe(25);
  });

  it("works in a zone east of UTC, where the local day starts the evening before in UTC", () => {
    // Asia/Tokyo is UTC+9 all year (no daylight time): 18:00 JST is 09:00 UTC.
    const w = lastEndedShift(new Date("2026-12-02T10:00:00Z"), "Asia/Tokyo", [1080]);
    expect(iso(w.end)).toBe("2026-12-02T09:00:00.000Z");
  });

  it("reads shift ends as typed and names what is wrong", () => {
    expect(parseShiftEnds("18:00")).toEqual({ ends: [1080] });
    expect(parseShiftEnds(" 18:00, 6:00 ")).toEqual({ ends: [360, 1080] });
    expect(parseShiftEnds("")).toEqual({ error: expect.stringContaining("at least one") });
    expect(parseShiftEnds("6pm")).toEqual({ error: expect.stringContaining('"6pm"') });
    expect(parseShiftEnds("24:00")).toEqual({ error: expect.stringContaining('"24:00"') });
    expect(parseShiftEnds("18:00 18:00")).toEqual({ error: "A shift end is given twice." });
    expect(parseShiftEnds("1:00 2:00 3:00 4:00 5:00")).toEqual({ error: "At most 4 shift ends a day." });
    expect(formatShiftEnd(360)).toBe("06:00");
  });
});
