import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listFieldPours } from "@/lib/server/list-field-pours";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { makePour, makeProject } from "../support/factories";

// The tablet's download list in the crew's order, with "today" taken on each project's own site.
let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
});
afterAll(async () => {
  await t.drop();
});

describe("listFieldPours", () => {
  it("lists today's pours on site first, then the coming ones, the past ones and the undated", async () => {
    // 2026-12-03 10:00 UTC is the 4th at UTC+14 (Pacific/Kiritimati) and still the 3rd in Honolulu (UTC−10).
    const now = new Date("2026-12-03T10:00:00Z");
    const east = await makeProject(t.db, { timeZone: "Pacific/Kiritimati" });
    const west = await makeProject(t.db, { timeZone: "Pacific/Honolulu" });
    const planned = async (projectId: string, name: string, day: string | null) => {
      const { id } = await makePour(t.db, projectId, { name });
      await t.db.updateTable("pours").set({ planned_stressing_date: day }).where("id", "=", id).execute();
    };
    await planned(west.id, "West next week", "2026-12-10");
    await planned(west.id, "West undated", null);
    await planned(west.id, "West last week", "2026-11-26");
    await planned(west.id, "West on the 4th", "2026-12-04");
    await planned(west.id, "West on the 3rd", "2026-12-03");
    await planned(east.id, "East on the 4th", "2026-12-04");
    await planned(east.id, "East on the 3rd", "2026-12-03");
    const crew = {
      memberships: [east, west].map((p) => ({
        projectId: p.id,
        role: "crew" as const,
        projectName: "",
        projectCode: "",
      })),
    };
    const { pours } = await listFieldPours(t.db, crew, now);
    expect(pours.map((p) => p.name)).toEqual([
      "East on the 4th", // today in the east
      "West on the 3rd", // today in the west
      "West on the 4th", // tomorrow in the west
      "West next week",
      "East on the 3rd", // yesterday in the east
      "West last week",
      "West undated",
    ]);
  });
});
