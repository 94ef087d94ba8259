import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { calibrationSchema } from "@/lib/schemas/calibration";
import { reportDaySchema } from "@/lib/schemas/daily-report";
import { dayInZone, latestDayAnywhere } from "@/lib/format/dates";
import { addCalibration } from "@/lib/server/add-calibration";
import { createEquipmentSet } from "@/lib/server/create-equipment-set";
import { signDailyReport } from "@/lib/server/sign-daily-report";
import { makeProject } from "../support/factories";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { calibrationBody } from "../support/api-routes";

// "Today" for a certificate or a day's report is the day on site, in the project's time zone, on
// real PostgreSQL. The request schemas only know a day has begun somewhere on Earth (UTC+14), so
// a site at UTC−11 (Pago Pago) is always at least one day behind that: a date the schema lets
// through must still be refused there, naming the field, and written nowhere. The calibration
// figures are invented (a straight line of about 5.1 kN per MPa, like a 100 t jack).

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
});
afterAll(async () => {
  await t.drop();
});

async function siteWithSet(timeZone: string) {
  const project = await makeProject(t.db, { timeZone });
  const { setId } = await createEquipmentSet(t.db, {
    projectId: project.id,
    values: {
      name: "Set D",
      jackSerial: "SD-J1",
      gaugeSerial: "SD-G1",
      pumpSerial: null,
      jackGripMm: null,
      maxForceN: null,
    },
  });
  return { projectId: project.id, setId };
}

describe("the site's day", () => {
  it("refuses a calibration dated after today on site even where that day has begun, and takes it where it has", async () => {
    const ahead = latestDayAnywhere();
    expect(ahead > dayInZone(Date.now(), "Pacific/Pago_Pago")).toBe(true);
    expect(calibrationSchema.safeParse(calibrationBody(ahead)).success).toBe(true);

    const behind = await siteWithSet("Pacific/Pago_Pago");
    await expect(addCalibration(t.db, { ...behind, values: calibrationBody(ahead) })).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { calibratedOn: [expect.stringContaining(dayInZone(Date.now(), "Pacific/Pago_Pago"))] },
    });
    const written = await t.db
      .selectFrom("calibrations")
      .select("id")
      .where("project_id", "=", behind.projectId)
      .execute();
    expect(written).toEqual([]);

    const first = await siteWithSet("Pacific/Kiritimati");
    await expect(addCalibration(t.db, { ...first, values: calibrationBody(ahead) })).resolves.toMatchObject({
      calibrationId: expect.any(String),
    });
  });

  it("refuses to sign a day's report for a day that has not begun on site, naming the day", async () => {
    const ahead = latestDayAnywhere();
    expect(reportDaySchema.safeParse(ahead).success).toBe(true);
    const behind = await siteWithSet("Pacific/Pago_Pago");
    const inspector = await t.db
      .insertInto("users")
      .values({
        email: "site-day-inspector@example.test",
        name: "Site Day Inspector",
        password_hash: null,
        email_verified: null,
        created_at: new Date(),
        updated_at: new Date(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await expect(
      signDailyReport(t.db, {
        projectId: behind.projectId,
        day: ahead,
        signer: inspector,
        values: {
          signerName: "Site Day Inspector",
          licence: "ICC special inspector (invented)",
          statement: "I inspected the stressing listed in this report, to the extent stated under what was witnessed.",
          remarks: "Nothing stressed.",
          conformance: "not_conforming",
          witness: [],
        },
      }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT", fields: { day: [expect.stringMatching(/not begun on site/)] } });
    const signed = await t.db
      .selectFrom("report_revisions")
      .select("id")
      .where("project_id", "=", behind.projectId)
      .execute();
    expect(signed).toEqual([]);
  });
});
