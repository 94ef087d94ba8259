import { describe, expect, it } from "vitest";
import { isTimeZone, projectSettingsSchema } from "./project-settings";

describe("the site's time zone on the settings form", () => {
  const zone = projectSettingsSchema.shape.timeZone;

  it("takes IANA names the runtime knows (IANA time zone database)", () => {
    for (const name of ["America/Chicago", "America/Los_Angeles", "Europe/Berlin", "UTC"]) {
      expect(isTimeZone(name), name).toBe(true);
      expect(zone.safeParse(name).success, name).toBe(true);
    }
  });

  it("refuses anything else with a message that names the field", () => {
    for (const name of ["Mars/Olympus", "Central", "CST6", "America/Chicago; drop", ""]) {
      const result = zone.safeParse(name);
      expect(result.success, name).toBe(false);
      expect(result.error!.issues[0]!.message, name).toMatch(/time zone/);
    }
    expect(zone.safeParse(42).error!.issues[0]!.message).toBe("Give the site's time zone, e.g. America/Chicago.");
  });
});
