import { mkdir, writeFile } from "node:fs/promises";
import { PDFParse } from "pdf-parse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { recordRows, RECORD_COLUMNS } from "@/lib/reports/pour-rows";
import { getDailyReport } from "@/lib/server/get-daily-report";
import { getPourReport } from "@/lib/server/get-pour-report";
import { demoDay, seedDemo } from "@/scripts/seed/demo";
import { demoFixture, insertRecord } from "../support/records";
import { createTestDatabase, type TestDatabase } from "../support/database";

/**
 * The demo's reports on paper, page by page: the sections flow one after the other, so no page but
 * the last is a leftover, and a table starts on a page only with its header and first rows. The
 * files are written to test-results/pdf/ to be looked at as images (pdftoppm).
 */

const OUT = "test-results/pdf";
// A fixed first seeding, so the demo's days are always the same ones.
const SEEDED = new Date("2026-12-02T18:00:00Z");

async function pagesOf(buffer: Buffer): Promise<string[][]> {
  const parser = new PDFParse({ data: new Uint8Array(buffer) });
  try {
    const result = await parser.getText();
    return result.pages.map((p) =>
      p.text
        .split("\n")
        .map((l) => l.trim())
        .filter(Boolean),
    );
  } finally {
    await parser.destroy();
  }
}

/** The lines of a page between the running head and the page number. */
const body = (page: string[]) => page.filter((l) => !/^Page \d+ of \d+$/.test(l) && !/ · .*report$/.test(l));

const HEADINGS = [
  "Release",
  "Summary",
  "Inspector's signature",
  "Computation basis and its sources",
  "Equipment sets and calibrations",
  "Strand lots",
  "Concrete results",
  "Flags and dispositions",
  "Statement of conformance",
  "Inspector's remarks",
  "Flags raised this day",
  "Dispositions recorded this day",
  "Equipment sets and calibrations used",
  "Concrete results entered",
  "Tails cut",
];

function expectFlowing(pages: string[][], name: string) {
  expect(pages.length, name).toBeGreaterThan(1);
  pages.forEach((page, i) => {
    const lines = body(page);
    // A page before the last holds a page's worth, not a section's leftover lines.
    if (i < pages.length - 1) expect(lines.length, `${name} page ${i + 1}`).toBeGreaterThanOrEqual(20);
    // No page ends on a heading or a table's header.
    const last = lines.at(-1) ?? "";
    expect(HEADINGS, `${name} page ${i + 1} ends on "${last}"`).not.toContain(last);
    expect(last, `${name} page ${i + 1}`).not.toMatch(/^Stressing records/);
  });
}

let t: TestDatabase;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { today: SEEDED, records: true });
  await mkdir(OUT, { recursive: true });
}, 180_000);

afterAll(async () => {
  await t?.drop();
});

describe("the demo's reports, page by page", () => {
  it("flow the pour's stressing report with no near-empty page and the record table's header on each of its pages", async () => {
    const fx = await demoFixture(t.db);
    for (const name of ["L2 Pour 1", "L2 Pour 2"]) {
      const pour = await t.db
        .selectFrom("pours")
        .select("id")
        .where("project_id", "=", fx.projectId)
        .where("name", "=", name)
        .executeTakeFirstOrThrow();
      const pdf = await renderPourPdf(await getPourReport(t.db, { projectId: fx.projectId, pourId: pour.id }));
      await writeFile(`${OUT}/demo-${name.replace(/\s+/g, "-")}.pdf`, pdf);
      const pages = await pagesOf(pdf);
      expectFlowing(pages, name);
      // The strand lots share a page with what comes before or after them.
      const lots = pages.find((p) => body(p).includes("Strand lots"))!;
      expect(body(lots).length).toBeGreaterThanOrEqual(20);
      // Every page after the table's first carries its title and header again until the flags.
      const first = pages.findIndex((p) => p.some((l) => l.startsWith("Stressing records, every stressing")));
      const flags = pages.findIndex((p) => p.includes("Flags and dispositions"));
      expect(first).toBeGreaterThanOrEqual(0);
      // The flags' page carries it too unless the table ended with the page before.
      const last = body(pages[flags]!)[0] === "Flags and dispositions" ? flags - 1 : flags;
      for (let i = first + 1; i <= last; i++) {
        expect(pages[i]!.join(" "), `${name} page ${i + 1}`).toContain("(continued)");
        expect(pages[i]!.join(" ")).toContain("Tendon, end,");
      }
    }
  }, 120_000);

  it("flows the day's special-inspection report the same way", async () => {
    const fx = await demoFixture(t.db);
    const day = demoDay(SEEDED, -7);
    const pdf = await renderDailyPdf(await getDailyReport(t.db, { projectId: fx.projectId, day }));
    await writeFile(`${OUT}/demo-daily-${day}.pdf`, pdf);
    expectFlowing(await pagesOf(pdf), `daily ${day}`);
  }, 120_000);
});

describe("a record stressed in the evening on the US west coast", () => {
  // 18:30 PST on 2026-12-02 is 02:30 UTC on 2026-12-03: America/Los_Angeles is UTC−8 in December
  // (IANA time zone database).
  it("is on its own day, at its own time, in the stressing report and the daily report", async () => {
    const own = await createTestDatabase({ migrate: true });
    try {
      await seedDemo(own.db, { today: SEEDED });
      const fx = await demoFixture(own.db);
      await own.db
        .updateTable("projects")
        .set({ time_zone: "America/Los_Angeles" })
        .where("id", "=", fx.projectId)
        .execute();
      const tendon = await fx.tendon("3-1-U01");
      await insertRecord(own.db, {
        projectId: fx.projectId,
        tendon,
        end: "A",
        equipmentSetId: fx.setA,
        authorId: fx.crewId,
        measuredMm: 150,
        finalPressureMPa: 30,
        deviceTime: "2026-12-03T02:30:00Z",
      });
      const report = await getPourReport(own.db, { projectId: fx.projectId, pourId: tendon.pour_id });
      const stressed = RECORD_COLUMNS.indexOf("Stressed");
      const row = recordRows(report).find((r) => r[0] === "3-1-U01")!;
      // The tablet recorded it in Chicago (the fixture's device zone); the report keeps the site's clock.
      expect(row[stressed]).toBe("2026-12-02 18:30 PST");

      const evening = await getDailyReport(own.db, { projectId: fx.projectId, day: "2026-12-02" });
      const next = await getDailyReport(own.db, { projectId: fx.projectId, day: "2026-12-03" });
      const pdfText = (await pagesOf(await renderDailyPdf(evening))).flat().join(" ");
      expect(pdfText).toContain("3-1-U01");
      expect(pdfText).toContain("2026-12-02 18:30 PST");
      expect((await pagesOf(await renderDailyPdf(next))).flat().join(" ")).not.toContain("3-1-U01");
    } finally {
      await own.drop();
    }
  }, 180_000);
});
