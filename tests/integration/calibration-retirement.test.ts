import { describe, expect, it } from "vitest";
import { calibrationCorrectionSchema, calibrationRetirementSchema, pickCalibration } from "@/lib/schemas/calibration";
import { addCalibration } from "@/lib/server/add-calibration";
import { correctCalibration } from "@/lib/server/correct-calibration";
import { createEquipmentSet } from "@/lib/server/create-equipment-set";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import {
  previewAddCalibration,
  previewCalibrationCorrection,
  previewCalibrationRetirement,
} from "@/lib/server/preview-calibration-correction";
import { retireCalibration } from "@/lib/server/retire-calibration";
import { calibrationBody } from "../support/api-routes";
import { insertRecord, seededDemoPerFile, demoPerson } from "../support/records";

// A calibration typed wrong is corrected, one found bad is retired, each with a reason and audited,
// on real PostgreSQL: the old figures stay, so the stored evaluation keeps the calibration it used;
// the tendons that stood on it are judged again; a retired calibration is never picked again.
// Calibration figures are invented (a straight line of about 5.1 kN per MPa, like a 100 t jack).

const { t, fx } = seededDemoPerFile();

type Used = { id: string; slope_n_per_mpa: number };
const usedOf = (inputs: unknown) =>
  ((typeof inputs === "string" ? JSON.parse(inputs) : inputs) as { calibrations: Used[] }).calibrations;

describe("correcting and retiring a calibration", () => {
  it("keeps the stored evaluation's calibration, re-judges on the correction, and never picks a retired one", async () => {
    const admin = await demoPerson(t.db, "admin@demo.tautline.test");
    const { setId } = await createEquipmentSet(t.db, {
      projectId: fx.projectId,
      values: {
        name: "Retirement test set",
        jackSerial: "RT-J1",
        gaugeSerial: "RT-G1",
        pumpSerial: null,
        jackGripMm: null,
        maxForceN: null,
      },
    });
    const first = await addCalibration(t.db, {
      projectId: fx.projectId,
      setId,
      values: calibrationBody("2026-11-02", 5100),
    });
    // A one-end tendon on a pour not yet stressed, read with this set (the record names no calibration).
    const tendon = await t.db
      .selectFrom("tendons")
      .innerJoin("pour_states", "pour_states.pour_id", "tendons.pour_id")
      .select(["tendons.id", "tendons.pour_id"])
      .where("tendons.project_id", "=", fx.projectId)
      .where("tendons.ends", "=", "A")
      .where("pour_states.status", "!=", "released")
      .where((w) =>
        w.not(w.exists(w.selectFrom("records").select("records.id").whereRef("records.tendon_id", "=", "tendons.id"))),
      )
      .orderBy("tendons.tag")
      .executeTakeFirstOrThrow();
    await insertRecord(t.db, {
      projectId: fx.projectId,
      tendon,
      end: "A",
      equipmentSetId: setId,
      authorId: fx.crewId,
      measuredMm: 200,
      finalPressureMPa: 30,
      deviceTime: "2026-12-01T16:00:00Z",
    });
    const before = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    const evaluations = () =>
      t.db
        .selectFrom("evaluations")
        .selectAll()
        .where("tendon_id", "=", tendon.id)
        .orderBy("created_at")
        .orderBy("id")
        .execute();
    const [stored] = await evaluations();
    expect(usedOf(stored!.inputs)).toMatchObject([
      { id: first.calibrationId, slope_n_per_mpa: expect.closeTo(5100, 6) },
    ]);
    expect(before).toBeTruthy();

    // Bad input names the field and writes nothing.
    const short = calibrationRetirementSchema.safeParse({ reason: "bad" });
    expect(short.error?.issues.map((i) => i.path.join("."))).toEqual(["reason"]);
    const future = calibrationCorrectionSchema.safeParse({
      reason: "The certificate's last point was typed wrong.",
      calibration: calibrationBody("2999-01-01", 5200),
    });
    expect(future.error?.issues.map((i) => i.path.join("."))).toEqual(["calibration.calibratedOn"]);

    // The preview runs the correction and rolls it back: it says how many tendons would be judged
    // again and whose verdict would change, and writes nothing (no calibration, evaluation or audit).
    const correction = {
      projectId: fx.projectId,
      setId,
      calibrationId: first.calibrationId,
      by: admin,
      reason: "Forces were copied from the 2025 certificate; these are the 2026 ones.",
      values: calibrationBody("2026-11-02", 5300),
    };
    const counts = async () => ({
      calibrations: (await t.db.selectFrom("calibrations").select("id").where("equipment_set_id", "=", setId).execute())
        .length,
      evaluations: (await evaluations()).length,
      audit: (await t.db.selectFrom("audit_events").select("id").where("action", "like", "calibration.%").execute())
        .length,
    });
    const untouched = await counts();
    const flagRows = () =>
      t.db.selectFrom("flags").select(["id", "status"]).where("tendon_id", "=", tendon.id).execute();
    /** Flags a change raised and open flags it closed, counted from the rows before and after. */
    const flagChange = (before: { id: string; status: string }[], after: { id: string; status: string }[]) => ({
      flagsRaising: after.filter((f) => !before.some((b) => b.id === f.id)).length,
      flagsClosing: before.filter((b) => b.status === "open" && after.find((f) => f.id === b.id)?.status === "closed")
        .length,
    });

    // Adding a calibration: the record named none, so its tendon would be judged again on the new
    // one; the preview says so and writes nothing. A date after the site's day is refused, naming it.
    const addition = {
      projectId: fx.projectId,
      setId,
      values: { ...correction.values, calibratedOn: "2026-11-20", points: calibrationBody("2026-11-20", 5250).points },
    };
    const added = await previewAddCalibration(t.db, addition);
    expect(added).toMatchObject({ rejudged: 1 });
    expect(added.verdictsChanging).toBe(added.tags.length);
    expect(await counts()).toEqual(untouched);
    await expect(
      previewAddCalibration(t.db, { ...addition, values: { ...addition.values, calibratedOn: "2999-01-01" } }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT", fields: { calibratedOn: [expect.any(String)] } });
    // A set with no record that names no calibration: nothing judged again.
    const { setId: emptySet } = await createEquipmentSet(t.db, {
      projectId: fx.projectId,
      values: {
        name: "Preview empty set",
        jackSerial: "PE-J1",
        gaugeSerial: "PE-G1",
        pumpSerial: null,
        jackGripMm: null,
        maxForceN: null,
      },
    });
    expect(await previewAddCalibration(t.db, { ...addition, setId: emptySet })).toEqual({
      rejudged: 0,
      verdictsChanging: 0,
      tags: [],
      flagsRaising: 0,
      flagsClosing: 0,
    });

    const flagsBeforeCorrection = await flagRows();
    const preview = await previewCalibrationCorrection(t.db, correction);
    expect(preview.rejudged).toBe(1);
    expect(await counts()).toEqual(untouched);
    const retiredYet = await t.db
      .selectFrom("calibrations")
      .select("retired_at")
      .where("id", "=", first.calibrationId)
      .executeTakeFirstOrThrow();
    expect(retiredYet.retired_at).toBeNull();
    // A calibration that does not exist on this set is refused by the preview as by the correction.
    await expect(previewCalibrationCorrection(t.db, { ...correction, calibrationId: fx.setA })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });

    // The correction: a new calibration replaces the old, whose figures stay as they were.
    const corrected = await correctCalibration(t.db, correction);
    expect(corrected.reevaluated).toBe(1);
    const old = await t.db
      .selectFrom("calibrations")
      .selectAll()
      .where("id", "=", first.calibrationId)
      .executeTakeFirstOrThrow();
    expect(old).toMatchObject({
      replaced_by: corrected.calibrationId,
      retired_by: admin.id,
      slope_n_per_mpa: expect.closeTo(5100, 6),
    });
    expect(old.retired_reason).toMatch(/^Corrected: Forces were copied/);
    const afterCorrection = await evaluations();
    expect(usedOf(afterCorrection[0]!.inputs)[0]!.id).toBe(first.calibrationId);
    const latest = afterCorrection.at(-1)!;
    expect(latest.reason).toMatch(/^calibration of 2026-11-02 corrected: Forces were copied/);
    // The preview said what the correction then did: the same verdict change (or none).
    const changed = latest.verdict !== stored!.verdict;
    expect(preview).toEqual({
      rejudged: 1,
      verdictsChanging: changed ? 1 : 0,
      tags: changed ? [expect.any(String)] : [],
      ...flagChange(flagsBeforeCorrection, await flagRows()),
    });
    expect(usedOf(latest.inputs)).toMatchObject([
      { id: corrected.calibrationId, slope_n_per_mpa: expect.closeTo(5300, 6) },
    ]);

    // Correcting or retiring the old one again is refused; the office and tablet never pick it.
    await expect(
      retireCalibration(t.db, {
        projectId: fx.projectId,
        setId,
        calibrationId: first.calibrationId,
        by: admin,
        reason: "Retire it twice, which must fail.",
      }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    const rows = async () =>
      (
        await t.db
          .selectFrom("calibrations")
          .select(["id", "calibrated_on", "retired_at"])
          .where("equipment_set_id", "=", setId)
          .execute()
      ).map((c) => ({ id: c.id, calibratedOn: c.calibrated_on, retiredAt: c.retired_at }));
    expect(pickCalibration(await rows(), "2026-12-01")?.id).toBe(corrected.calibrationId);

    // Retiring the correction leaves the set with no calibration for the day: the tendon is judged
    // again without one, so no force is read from the gauge. The preview first: it writes nothing,
    // refuses what the retirement refuses, and says what the retirement then does.
    const retirement = {
      projectId: fx.projectId,
      setId,
      calibrationId: corrected.calibrationId,
      by: admin,
      reason: "The gauge was dropped after calibration; sent back to the laboratory.",
    };
    await expect(
      previewCalibrationRetirement(t.db, { ...retirement, calibrationId: first.calibrationId }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    const beforeRetirement = await counts();
    const verdictBeforeRetirement = (await evaluations()).at(-1)!.verdict;
    const flagsBeforeRetirement = await flagRows();
    const retirePreview = await previewCalibrationRetirement(t.db, retirement);
    expect(await counts()).toEqual(beforeRetirement);
    expect(await flagRows()).toEqual(flagsBeforeRetirement);
    const stillStanding = await t.db
      .selectFrom("calibrations")
      .select("retired_at")
      .where("id", "=", corrected.calibrationId)
      .executeTakeFirstOrThrow();
    expect(stillStanding.retired_at).toBeNull();
    const retired = await retireCalibration(t.db, retirement);
    expect(retired.reevaluated).toBe(1);
    const retiredVerdict = (await evaluations()).at(-1)!.verdict;
    const retirementChanged = retiredVerdict !== verdictBeforeRetirement;
    expect(retirePreview).toEqual({
      rejudged: 1,
      verdictsChanging: retirementChanged ? 1 : 0,
      tags: retirementChanged ? [expect.any(String)] : [],
      ...flagChange(flagsBeforeRetirement, await flagRows()),
    });
    expect(pickCalibration(await rows(), "2026-12-01")).toBeNull();
    const final = (await evaluations()).at(-1)!;
    expect(final.reason).toMatch(/retired: The gauge was dropped/);
    expect(usedOf(final.inputs)).toEqual([]);
    const readings = (final.inputs as unknown as { readings: { gaugeForceN: number | null }[] }).readings;
    expect(readings.map((r) => r.gaugeForceN)).toEqual([null]);
    expect(usedOf(latest.inputs).length).toBe(1);
    expect((await evaluations()).length).toBe(3);

    const audit = await t.db
      .selectFrom("audit_events")
      .select(["action", "target", "actor_user_id"])
      .where("action", "in", ["calibration.correct", "calibration.retire"])
      .orderBy("id")
      .execute();
    expect(audit).toEqual([
      { action: "calibration.correct", target: `calibration:${first.calibrationId}`, actor_user_id: admin.id },
      { action: "calibration.retire", target: `calibration:${corrected.calibrationId}`, actor_user_id: admin.id },
    ]);
  }, 60_000);
});
