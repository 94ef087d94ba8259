import { describe, expect, it } from "vitest";
import { dayInZone, formatAge, formatDateTime, projectTimeZone } from "./dates";

describe("dates in the project's zone", () => {
  it("an evening record in Chicago belongs to that day, not to the next UTC day", () => {
    // 2026-12-03T00:30Z is 18:30 on 2 Dec in Chicago (UTC−6 in December).
    expect(dayInZone("2026-12-03T00:30:00Z", "America/Chicago")).toBe("2026-12-02");
    expect(dayInZone("2026-12-03T00:30:00Z", "UTC")).toBe("2026-12-03");
  });

  it("writes a moment with the zone's name", () => {
    expect(formatDateTime("2026-12-03T00:30:00Z", "America/Chicago")).toBe("2026-12-02 18:30 CST");
  });

  it("writes ages in words", () => {
    expect(formatAge("2026-12-02T10:00:00Z", "2026-12-02T13:00:00Z")).toBe("3 hours ago");
  });

  it("shows a project in its own zone, and in UTC when it names none", () => {
    expect(projectTimeZone({ time_zone: "America/Chicago" })).toBe("America/Chicago");
    expect(projectTimeZone({ timeZone: "Europe/Berlin" })).toBe("Europe/Berlin");
    expect(projectTimeZone({ time_zone: null })).toBe("UTC");
    expect(projectTimeZone({})).toBe("UTC");
  });
});
