import { describe, expect, it } from "vitest";
import { orderPoursForCrew } from "./pour-order";

// Days and names are invented for the table; the rule is the crew's: today first, then the
// coming days nearest first, then past days most recent first, undated last.
const pour = (name: string, plannedStressingDate: string | null, zone = "site") => ({
  name,
  plannedStressingDate,
  zone,
});

describe("orderPoursForCrew", () => {
  const today = "2026-12-03";
  const cases: { title: string; pours: ReturnType<typeof pour>[]; expected: string[] }[] = [
    {
      title: "today's pour comes before next week's and last week's",
      pours: [pour("Next week", "2026-12-10"), pour("Last week", "2026-11-26"), pour("Today", today)],
      expected: ["Today", "Next week", "Last week"],
    },
    {
      title: "coming pours nearest first",
      pours: [pour("In ten days", "2026-12-13"), pour("Tomorrow", "2026-12-04"), pour("In a week", "2026-12-10")],
      expected: ["Tomorrow", "In a week", "In ten days"],
    },
    {
      title: "past pours most recent first",
      pours: [pour("A month ago", "2026-11-03"), pour("Yesterday", "2026-12-02"), pour("Last week", "2026-11-26")],
      expected: ["Yesterday", "Last week", "A month ago"],
    },
    {
      title: "undated pours last, after past ones",
      pours: [pour("Not planned", null), pour("Yesterday", "2026-12-02"), pour("Today", today)],
      expected: ["Today", "Yesterday", "Not planned"],
    },
    {
      title: "pours of the same day by name, numbers read as numbers",
      pours: [pour("L10 Pour 1", today), pour("L2 Pour 2", today), pour("L2 Pour 1", today)],
      expected: ["L2 Pour 1", "L2 Pour 2", "L10 Pour 1"],
    },
    {
      title: "an empty list stays empty",
      pours: [],
      expected: [],
    },
  ];
  for (const c of cases)
    it(c.title, () => {
      expect(orderPoursForCrew(c.pours, () => today).map((p) => p.name)).toEqual(c.expected);
    });

  it("takes today from each pour's own site: a day that is today in one zone is tomorrow in another", () => {
    // At one instant the site to the east is already on the 4th while the other is still on the 3rd.
    const todays: Record<string, string> = { east: "2026-12-04", west: "2026-12-03" };
    const pours = [pour("West, on the 4th", "2026-12-04", "west"), pour("East, on the 4th", "2026-12-04", "east")];
    expect(orderPoursForCrew(pours, (p) => todays[p.zone]!).map((p) => p.name)).toEqual([
      "East, on the 4th",
      "West, on the 4th",
    ]);
  });

  it("leaves the list it was given as it was", () => {
    const pours = [pour("B", "2026-12-01"), pour("A", today)];
    orderPoursForCrew(pours, () => today);
    expect(pours.map((p) => p.name)).toEqual(["B", "A"]);
  });
});
