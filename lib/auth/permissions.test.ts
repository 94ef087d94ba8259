import { describe, expect, it } from "vitest";
import { PERMISSIONS, ROLES, can } from "./permissions";

describe("the permission table", () => {
  it("denies what it does not list", () => {
    expect(can("crew", "members.manage")).toBe(false);
    expect(can("inspector", "disposition.create")).toBe(false);
    expect(can("admin", "record.create")).toBe(false);
  });

  it("gives the engineer of record alone the disposition; the release goes to the engineer or the inspector", () => {
    for (const role of ROLES) {
      expect(can(role, "disposition.create")).toBe(role === "engineer");
      expect(can(role, "pour.release")).toBe(role === "engineer" || role === "inspector");
    }
  });

  it("lets only the crew create stressing records, and everyone on the project read them", () => {
    expect(ROLES.filter((r) => can(r, "record.create"))).toEqual(["crew"]);
    expect(ROLES.filter((r) => can(r, "record.view"))).toEqual(ROLES);
  });

  it("names only known roles", () => {
    for (const roles of Object.values(PERMISSIONS)) for (const r of roles) expect(ROLES).toContain(r);
  });
});
