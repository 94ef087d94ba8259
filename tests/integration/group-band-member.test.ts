import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { settingsFields } from "@/lib/schemas/project-settings";
import { addCalibration } from "@/lib/server/add-calibration";
import { createEquipmentSet } from "@/lib/server/create-equipment-set";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { previewSettingsChange } from "@/lib/server/preview-settings-change";
import { updateProjectSettings } from "@/lib/server/update-project-settings";
import { HALF_INCH, insertRecord, predictionAsRead } from "../support/records";
import { calibrationBody } from "../support/api-routes";
import { makePour, makeProject, makeTendons } from "../support/factories";
import { createTestDatabase, type TestDatabase } from "../support/database";

// The group-average band on real PostgreSQL, when the schedule names member groups: the average is
// taken per member (rules/group-out-of-band.ts, the group query of lib/server/evaluate-tendon.ts),
// never over the whole pour. One pour, two members of two one-end tendons each, every tendon
// inside its own ±7 % band: member M1 read +6 % and +6 % (average +6 %, outside a ±5 % group band),
// member M2 read +1 % and −1 % (average 0 %). The pour's average, +3 %, is inside the group band,
// so only a per-member average flags anything, and only on M1. Readings and bands are our test
// values; a ±5 % group band beside ±7 % per tendon is a common specification (from memory).
// Jacking at 0.80·fpu·A (ACI 318-19 Table 20.3.2.5.1, from memory), 0.5 in strand 41,300 lbf
// (ASTM A416 Table 1). The settings preview is checked on the same change: a group band moves
// flags, not verdicts, and the preview counts them.

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
});
afterAll(async () => {
  await t.drop();
});

describe("the group-average band of a schedule with member groups", () => {
  it("averages each member on its own: the member outside the band is flagged, the other member of the pour is not", async () => {
    const project = await makeProject(t.db, { timeZone: "America/Chicago" });
    const crew = await t.db
      .insertInto("users")
      .values({ email: "group-crew@example.test", name: "Group crew" })
      .returning("id")
      .executeTakeFirstOrThrow();
    const { setId } = await createEquipmentSet(t.db, {
      projectId: project.id,
      values: {
        name: "Jack G",
        jackSerial: "GJ-1",
        gaugeSerial: "GG-1",
        pumpSerial: null,
        jackGripMm: null,
        maxForceN: null,
      },
    });
    // A straight calibration line of about 5.1 kN per MPa (invented figures, like a 100 t jack).
    await addCalibration(t.db, {
      projectId: project.id,
      setId,
      values: calibrationBody("2026-11-02"),
    });
    const pressure = (0.8 * HALF_INCH.minBreakingStrengthN + 900) / 5100;
    const pour = await makePour(t.db, project.id, { name: "Level 3 deck" });
    const shape = {
      kind: "unbonded_monostrand" as const,
      strandSize: "0.5 in",
      strandCount: 1,
      segments: [{ lengthMm: 24_000, angleRad: 0.2 }],
      ends: "A" as const,
      jackGripMm: null,
    };
    const where = { projectId: project.id, pourId: pour.id };
    const [m1a, m1b] = await makeTendons(t.db, where, ["M1-1", "M1-2"], { ...shape, member: "M1" });
    const [m2a, m2b] = await makeTendons(t.db, where, ["M2-1", "M2-2"], { ...shape, member: "M2" });
    // Stressed one member's tendon after the other's, so the pour's tendons interleave in time.
    const plan = [
      [m1a!, 1.06],
      [m2a!, 1.01],
      [m1b!, 1.06],
      [m2b!, 0.99],
    ] as const;
    for (const [k, [tendon, factor]] of plan.entries()) {
      await insertRecord(t.db, {
        projectId: project.id,
        tendon,
        end: "A",
        equipmentSetId: setId,
        authorId: crew.id,
        measuredMm: (await predictionAsRead(t.db, { projectId: project.id, tendonId: tendon.id })).mm * factor,
        finalPressureMPa: pressure,
        deviceTime: `2026-12-01T1${4 + k}:00:00Z`,
      });
      const outcome = await evaluateTendon(t.db, { projectId: project.id, tendonId: tendon.id, reason: "sync" });
      // No group band yet, and each tendon inside its own ±7 % band. (At 0.80·fpu·A this short
      // profile's anchorage force after seating is over 0.70·fpu·A, a flag of its own that stays
      // open throughout and is no part of the group's.)
      expect(outcome.verdict).toBe("in band");
      expect(outcome.flagKinds).not.toContain("out_of_band");
      expect(outcome.flagKinds).not.toContain("group_out_of_band");
    }
    const flags = () =>
      t.db
        .selectFrom("flags")
        .innerJoin("tendons", "tendons.id", "flags.tendon_id")
        .select(["tendons.tag", "flags.kind", "flags.reason", "flags.status"])
        .where("flags.pour_id", "=", pour.id)
        .where("flags.kind", "=", "group_out_of_band")
        .orderBy("tendons.tag")
        .execute();
    expect(await flags()).toEqual([]);

    // The admin sets a ±5 % group band: the preview counts the flag it raises, though no verdict
    // changes, and writes nothing.
    const settings = settingsFields(await getProjectSettings(t.db, project.id));
    expect(settings.groupTolerancePct).toBeNull();
    const withBand = { projectId: project.id, values: { ...settings, groupTolerancePct: 5 }, by: crew.id };
    const preview = await previewSettingsChange(t.db, withBand);
    expect(preview).toEqual({ rejudged: 4, verdictsChanging: 0, tags: [], flagsRaising: 1, flagsClosing: 0 });
    expect(await flags()).toEqual([]);
    expect((await getProjectSettings(t.db, project.id)).groupTolerancePct).toBeNull();

    // Saving does what the preview said: M1 averages +6.0 %, flagged on its tendon stressed last;
    // M2 averages 0 % and is not flagged, nor is the pour's +3 % average.
    const saved = await updateProjectSettings(t.db, withBand);
    expect(saved).toMatchObject({ reevaluated: 4, changed: 0, closedFlags: 0 });
    expect(await flags()).toEqual([
      {
        tag: "M1-2",
        kind: "group_out_of_band",
        status: "open",
        reason: expect.stringMatching(
          /^The 2 tendons of member M1 average \+6\.0 % from their predictions, long of the ±5 % group band/,
        ),
      },
    ]);

    // Taking the band away: the preview says the open flag closes, again without a verdict changing.
    const withoutBand = { projectId: project.id, values: { ...settings, groupTolerancePct: null }, by: crew.id };
    expect(await previewSettingsChange(t.db, withoutBand)).toEqual({
      rejudged: 4,
      verdictsChanging: 0,
      tags: [],
      flagsRaising: 0,
      flagsClosing: 1,
    });
    expect(await flags()).toEqual([expect.objectContaining({ tag: "M1-2", status: "open" })]);
    expect(await updateProjectSettings(t.db, withoutBand)).toMatchObject({ closedFlags: 1 });
    expect(await flags()).toEqual([expect.objectContaining({ tag: "M1-2", status: "closed" })]);
  }, 60_000);
});
