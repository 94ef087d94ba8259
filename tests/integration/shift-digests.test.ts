import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { drainNotifications } from "@/lib/server/dispatch-notifications";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { queueShiftDigests } from "@/lib/server/queue-shift-digests";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { setFlagMail } from "@/lib/server/set-flag-mail";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { getFlagMail } from "@/lib/server/get-flag-mail";
import { updateProjectSettings } from "@/lib/server/update-project-settings";
import { projectSettingsSchema, settingsFields } from "@/lib/schemas/project-settings";
import { predictTendon } from "@/lib/stressing/basis";
import { type TestDatabase } from "../support/database";
import { seededDemo, type DemoFixture, insertDemoRecord, demoPerson } from "../support/records";

// The project's zone is America/Chicago, UTC−5 in June (CDT) and UTC−6 in December (CST), from
// the IANA time zone database. A shift end of 18:00 local is 23:00 UTC on 2025-06-10.

let t: TestDatabase;
let fx: DemoFixture;
let engineerId: string;

beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  engineerId = (await demoPerson(t.db, "engineer@demo.tautline.test")).id;
  await t.db
    .updateTable("projects")
    .set({ time_zone: "America/Chicago", shift_end_minutes: [18 * 60] })
    .where("id", "=", fx.projectId)
    .execute();
});
afterAll(async () => {
  await t.drop();
});

const digestsOf = (userId: string) =>
  t.db
    .selectFrom("notifications")
    .select(["id", "dedupe_key", "to_emails", "subject", "text_body", "html_body"])
    .where("project_id", "=", fx.projectId)
    .where("dedupe_key", "like", `digest:${fx.projectId}:${userId}:%`)
    .orderBy("created_at")
    .execute();

async function raiseFlag(tag: string, kind: "out_of_band" | "seating_excess", at: string, reason: string) {
  const tendon = await fx.tendon(tag);
  await t.db
    .insertInto("flags")
    .values({
      project_id: fx.projectId,
      pour_id: tendon.pour_id,
      tendon_id: tendon.id,
      kind,
      reason,
      created_at: new Date(at),
    })
    .execute();
}

describe("the engineer's shift digest", () => {
  it("is sent once, at the shift end in the project's zone, even by two dispatchers at the same moment", async () => {
    await t.db
      .updateTable("project_members")
      .set({ flag_mail: "digest", digest_from: new Date("2025-06-09T23:00:00Z") })
      .where("project_id", "=", fx.projectId)
      .where("user_id", "=", engineerId)
      .execute();
    // 10:00 and 17:30 CDT fall in the shift that ends at 18:00 CDT; 18:30 CDT in the next.
    await raiseFlag("2-1-U01", "out_of_band", "2025-06-10T15:00:00Z", "Measured 4.10 in against 3.60 in predicted.");
    await raiseFlag("2-1-U02", "seating_excess", "2025-06-10T22:30:00Z", "Seating 0.40 in, over the limit.");
    await raiseFlag("2-1-U03", "out_of_band", "2025-06-10T23:30:00Z", "Measured 3.10 in against 3.60 in predicted.");

    // 17:59 CDT is 22:59 UTC: 18:00 has passed in UTC but not in Chicago, so nothing goes yet.
    expect(await queueShiftDigests(t.db, { now: new Date("2025-06-10T22:59:00Z") })).toBe(0);
    expect(await digestsOf(engineerId)).toEqual([]);

    // 18:00:30 CDT: two dispatchers at once queue one digest between them.
    const now = new Date("2025-06-10T23:00:30Z");
    const counts = await Promise.all([queueShiftDigests(t.db, { now }), queueShiftDigests(t.db, { now })]);
    expect(counts.sort()).toEqual([0, 1]);
    const digests = await digestsOf(engineerId);
    expect(digests).toHaveLength(1);
    const mail = digests[0]!;
    expect(mail.dedupe_key).toBe(`digest:${fx.projectId}:${engineerId}:2025-06-10T23:00:00.000Z`);
    expect(mail.to_emails).toEqual(["engineer@demo.tautline.test"]);
    expect(mail.subject).toContain("2 flags");
    expect(mail.text_body).toContain("2025-06-09 18:00 CDT to 2025-06-10 18:00 CDT");
    expect(mail.text_body).toContain("tendon 2-1-U01: Out of band");
    expect(mail.text_body).toContain("tendon 2-1-U02");
    expect(mail.text_body).not.toContain("2-1-U03");
    expect(mail.text_body).toContain("OSHA 29 CFR 1926.701(c)");
    expect(mail.text_body).not.toMatch(/MPa/);

    // Again a minute later, and a third dispatcher: nothing more.
    expect(await queueShiftDigests(t.db, { now: new Date("2025-06-10T23:01:30Z") })).toBe(0);
    expect(await digestsOf(engineerId)).toHaveLength(1);

    // The outbox sends it once.
    const sent: string[] = [];
    await drainNotifications(t.db, async (m) => {
      sent.push(m.subject);
    });
    expect(sent.filter((s) => s === mail.subject)).toHaveLength(1);

    // The next shift's digest carries the 18:30 flag only.
    expect(await queueShiftDigests(t.db, { now: new Date("2025-06-11T23:00:00Z") })).toBe(1);
    const next = (await digestsOf(engineerId))[1]!;
    expect(next.text_body).toContain("2-1-U03");
    expect(next.text_body).not.toContain("2-1-U01");
  });

  it("going back to one e-mail per flag sends what the open digest holds at once", async () => {
    await raiseFlag("2-1-U04", "out_of_band", "2025-06-12T15:00:00Z", "Measured 4.20 in against 3.60 in predicted.");
    const before = (await digestsOf(engineerId)).length;
    const answer = await setFlagMail(t.db, {
      projectId: fx.projectId,
      userId: engineerId,
      mode: "each",
      now: new Date("2025-06-12T16:00:00Z"),
    });
    expect(answer).toEqual({ mode: "each", digestQueued: true });
    const digests = await digestsOf(engineerId);
    expect(digests).toHaveLength(before + 1);
    expect(digests.at(-1)!.text_body).toContain("2-1-U04");
    const member = await t.db
      .selectFrom("project_members")
      .select(["flag_mail", "digest_from"])
      .where("project_id", "=", fx.projectId)
      .where("user_id", "=", engineerId)
      .executeTakeFirstOrThrow();
    expect(member).toEqual({ flag_mail: "each", digest_from: null });
    // The engineer's own screen reads the choice, the project's shift and that the address is listed.
    const shown = await getFlagMail(t.db, {
      projectId: fx.projectId,
      userId: engineerId,
      now: new Date("2025-06-12T16:00:00Z"),
    });
    expect(shown).toMatchObject({ mode: "each", timeZone: "America/Chicago", shiftEnds: [1080], listed: true });
    expect(shown.nextEnd.toISOString()).toBe("2025-06-12T23:00:00.000Z");
  });

  it("keeps a digest reader off the flag's own e-mail, and the inspector still gets it", async () => {
    await setFlagMail(t.db, { projectId: fx.projectId, userId: engineerId, mode: "digest" });
    // 2-1-U02 is a one-end tendon with only a seating flag open (raised above).
    const tendon = await fx.tendon("2-1-U02");
    const basis = await loadTendonBasis(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    expect(basis.project.digestEmails).toEqual(["engineer@demo.tautline.test"]);
    const predicted = predictTendon({
      project: basis.project,
      tendon: basis.tendon,
      lot: basis.lot,
      equipmentGripMm: 457.2,
    });
    const calibration = await t.db
      .selectFrom("calibrations")
      .select(["slope_n_per_mpa", "intercept_n"])
      .where("equipment_set_id", "=", fx.setA)
      .executeTakeFirstOrThrow();
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm * 1.12,
      finalPressureMPa: (predicted.jackingForceN - calibration.intercept_n) / calibration.slope_n_per_mpa,
    });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.flagKinds).toEqual(["out_of_band"]);
    const mails = await t.db
      .selectFrom("notifications")
      .innerJoin("flags", "flags.id", "notifications.flag_id")
      .select(["notifications.to_emails", "notifications.text_body"])
      .where("flags.tendon_id", "=", tendon.id)
      .execute();
    expect(mails.map((m) => m.to_emails)).toEqual([["inspector@demo.tautline.test"]]);
    // A US project: the basis line's wobble is per foot, and no SI unit appears.
    expect(mails[0]!.text_body).toMatch(/K 0\.\d{4} per ft/);
    expect(mails[0]!.text_body).not.toMatch(/MPa|per m\b| mm\b/);
  });

  it("follows the shift ends the admin sets: with 06:00 and 18:00 a night shift ends at 06:00", async () => {
    const settings = settingsFields(await getProjectSettings(t.db, fx.projectId));
    const refused = projectSettingsSchema.safeParse({ ...settings, shiftEndMinutes: [1080, 1080] });
    expect(refused.success).toBe(false);
    expect(JSON.stringify(refused.error?.issues)).toContain("A shift end is given twice.");
    const values = projectSettingsSchema.parse({ ...settings, shiftEndMinutes: [1080, 360] });
    const admin = await demoPerson(t.db, "admin@demo.tautline.test");
    await updateProjectSettings(t.db, { projectId: fx.projectId, values, by: admin.id });
    expect((await getProjectSettings(t.db, fx.projectId)).shiftEndMinutes).toEqual([360, 1080]);

    await t.db
      .updateTable("project_members")
      .set({ flag_mail: "digest", digest_from: new Date("2025-06-20T23:00:00Z") })
      .where("project_id", "=", fx.projectId)
      .where("user_id", "=", engineerId)
      .execute();
    // 02:00 CDT on 2025-06-21, in the night shift that ends at 06:00 CDT (11:00 UTC).
    await raiseFlag("2-1-U04", "seating_excess", "2025-06-21T07:00:00Z", "Seating 0.45 in, over the limit.");
    expect(await queueShiftDigests(t.db, { now: new Date("2025-06-21T10:59:00Z") })).toBe(0);
    expect(await queueShiftDigests(t.db, { now: new Date("2025-06-21T11:00:00Z") })).toBe(1);
    expect((await digestsOf(engineerId)).at(-1)!.text_body).toContain("2025-06-20 18:00 CDT to 2025-06-21 06:00 CDT");
  });
});
