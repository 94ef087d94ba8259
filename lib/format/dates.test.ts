import { describe, expect, it } from "vitest";
import {
  formatRecentDateTime,
  dayBounds,
  dayInZone,
  formatAge,
  formatShortAge,
  formatDateTime,
  formatSpan,
  instantFromLocalInput,
  localInputValue,
  projectTimeZone,
  shiftDay,
} from "./dates";

describe("dates in the project's zone", () => {
  it("an evening record in Chicago belongs to that day, not to the next UTC day", () => {
    // 2026-12-03T00:30Z is 18:30 on 2 Dec in Chicago (UTC−6 in December).
    expect(dayInZone("2026-12-03T00:30:00Z", "America/Chicago")).toBe("2026-12-02");
    expect(dayInZone("2026-12-03T00:30:00Z", "UTC")).toBe("2026-12-03");
  });

  it("writes a moment with the zone's name", () => {
    expect(formatDateTime("2026-12-03T00:30:00Z", "America/Chicago")).toBe("2026-12-02 18:30 CST");
  });

  it("writes the span between two moments in words, to the minute, either order", () => {
    expect(formatSpan("2026-12-02T10:00:00Z", "2026-12-02T10:32:00Z")).toBe("32 minutes");
    expect(formatSpan("2026-12-02T11:05:40Z", "2026-12-02T10:00:00Z")).toBe("1 hour 5 minutes");
    expect(formatSpan("2026-12-02T10:00:00Z", "2026-12-04T13:00:00Z")).toBe("2 days 3 hours");
    expect(formatSpan("2026-12-02T10:00:00Z", "2026-12-02T10:00:30Z")).toBe("under a minute");
  });

  it("writes ages in words", () => {
    expect(formatAge("2026-12-02T10:00:00Z", "2026-12-02T13:00:00Z")).toBe("3 hours ago");
  });

  it("writes short ages for the tablet's status bar, counted down to the unit", () => {
    const now = "2026-12-02T13:00:00Z";
    expect(formatShortAge("2026-12-02T12:59:30Z", now)).toBe("just now");
    expect(formatShortAge("2026-12-02T12:55:00Z", now)).toBe("5 min ago");
    expect(formatShortAge("2026-12-02T12:00:01Z", now)).toBe("59 min ago");
    expect(formatShortAge("2026-12-02T11:00:00Z", now)).toBe("2 h ago");
    expect(formatShortAge("2026-11-29T12:00:00Z", now)).toBe("3 d ago");
    expect(formatShortAge("2026-12-02T13:05:00Z", now)).toBe("just now");
  });

  it("shows a project in its own zone, and in UTC when it names none", () => {
    expect(projectTimeZone({ time_zone: "America/Chicago" })).toBe("America/Chicago");
    expect(projectTimeZone({ timeZone: "Europe/Berlin" })).toBe("Europe/Berlin");
    expect(projectTimeZone({ time_zone: null })).toBe("UTC");
    expect(projectTimeZone({})).toBe("UTC");
  });

  it("spans a day in the project's zone, 23 or 25 hours across a clock change", () => {
    // Chicago is UTC−6 in winter and UTC−5 in summer (IANA tz database); clocks went back on 2026-11-01.
    const winter = dayBounds("2026-12-02", "America/Chicago");
    expect(winter.start.toISOString()).toBe("2026-12-02T06:00:00.000Z");
    expect(winter.end.toISOString()).toBe("2026-12-03T06:00:00.000Z");
    const fallBack = dayBounds("2026-11-01", "America/Chicago");
    expect(fallBack.start.toISOString()).toBe("2026-11-01T05:00:00.000Z");
    expect((fallBack.end.getTime() - fallBack.start.getTime()) / 3_600_000).toBe(25);
    // The evening record above falls inside its Chicago day, not inside the UTC day it is stamped with.
    const evening = new Date("2026-12-03T00:30:00Z").getTime();
    expect(evening >= winter.start.getTime() && evening < winter.end.getTime()).toBe(true);
    expect(dayBounds("2026-12-03", "UTC").start.getTime()).toBeLessThanOrEqual(evening);
  });

  it("steps from one calendar day to the next and back, across months and years", () => {
    expect(shiftDay("2026-12-31", 1)).toBe("2027-01-01");
    expect(shiftDay("2026-03-01", -1)).toBe("2026-02-28");
    expect(shiftDay("2026-11-01", 1)).toBe("2026-11-02");
  });
});

describe("a date-and-time box in the project's zone", () => {
  it("shows and reads a moment in the zone, not in the browser's", () => {
    // 2026-12-03T00:30Z is 18:30 on 2 Dec in Chicago (UTC−6 in December).
    expect(localInputValue("2026-12-03T00:30:00Z", "America/Chicago")).toBe("2026-12-02T18:30");
    expect(instantFromLocalInput("2026-12-02T18:30", "America/Chicago")?.toISOString()).toBe(
      "2026-12-03T00:30:00.000Z",
    );
  });

  it("reads nothing from a value that is not a date and time", () => {
    expect(instantFromLocalInput("", "UTC")).toBeNull();
    expect(instantFromLocalInput("2026-06-31T10:00", "UTC")).toBeNull();
    expect(instantFromLocalInput("yesterday", "UTC")).toBeNull();
  });
});

describe("formatRecentDateTime", () => {
  it("gives the time alone on the same day in the zone, the date too on another", () => {
    // 2026-12-02 23:30 UTC is 17:30 CST the same day in Chicago (UTC−6 in December; IANA tz database).
    const now = "2026-12-02T23:40:00Z";
    expect(formatRecentDateTime("2026-12-02T23:30:00Z", "America/Chicago", now)).toBe("17:30 CST");
    // 05:30 UTC on the 2nd is 23:30 CST on the 1st: another day in Chicago.
    expect(formatRecentDateTime("2026-12-02T05:30:00Z", "America/Chicago", now)).toBe("2026-12-01 23:30 CST");
    expect(formatRecentDateTime("2026-12-02T05:30:00Z", "UTC", now)).toBe("05:30 UTC");
  });
});
