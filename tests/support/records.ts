import { uuidv7 } from "uuidv7";
import type { Db } from "@/db/connect";
import type { TendonEnd } from "@/lib/schemas/domain";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { judgeStressing } from "@/lib/stressing/judge";

/** Fixtures for tests that need stressing records without going through the tablet's sync. */

export async function demoFixture(db: Db) {
  const project = await db.selectFrom("projects").select(["id"]).where("code", "=", "AYP").executeTakeFirstOrThrow();
  const crew = await db
    .selectFrom("users")
    .select("id")
    .where("email", "=", "crew@demo.tautline.test")
    .executeTakeFirstOrThrow();
  const sets = await db
    .selectFrom("equipment_sets")
    .select(["id", "name"])
    .where("project_id", "=", project.id)
    .orderBy("name")
    .execute();
  const tendon = async (tag: string) =>
    db
      .selectFrom("tendons")
      .select(["id", "pour_id", "ends"])
      .where("project_id", "=", project.id)
      .where("tag", "=", tag)
      .executeTakeFirstOrThrow();
  return { projectId: project.id, crewId: crew.id, setA: sets[0]!.id, setB: sets[1]!.id, tendon };
}

export async function insertRecord(
  db: Db,
  input: {
    projectId: string;
    tendon: { id: string; pour_id: string };
    end: TendonEnd;
    equipmentSetId: string;
    authorId: string;
    measuredMm: number;
    finalPressureMPa: number;
    initialPressureMPa?: number | null;
    wireBreaks?: number;
    deviceTime?: string;
    /** When the server received it (default now, the column's own). */
    receivedAt?: Date;
    restressOfDispositionId?: string;
    base?: { id: string; chainId: string; revision: number; reason: string };
  },
): Promise<string> {
  const id = uuidv7();
  await db
    .insertInto("records")
    .values({
      id,
      project_id: input.projectId,
      pour_id: input.tendon.pour_id,
      tendon_id: input.tendon.id,
      tendon_end: input.end,
      chain_id: input.base?.chainId ?? id,
      revision: input.base ? input.base.revision + 1 : 1,
      base_record_id: input.base?.id ?? null,
      revision_reason: input.base?.reason ?? null,
      equipment_set_id: input.equipmentSetId,
      initial_pressure_mpa: input.initialPressureMPa ?? null,
      final_pressure_mpa: input.finalPressureMPa,
      reading_method: "marks",
      entered: JSON.stringify({ unit: "mm", measuredMm: input.measuredMm }),
      measured_mm: input.measuredMm,
      wire_breaks: input.wireBreaks ?? 0,
      device_time: input.deviceTime ?? new Date().toISOString(),
      device_time_zone: "America/Chicago",
      device_id: "test-device",
      author_user_id: input.authorId,
      restress_of_disposition_id: input.restressOfDispositionId ?? null,
      ...(input.receivedAt ? { received_at: input.receivedAt } : {}),
    })
    .execute();
  return id;
}

/**
 * The judge's prediction for end A of a one-end tendon as stored now, read the way `method` says:
 * marks after lock-off (net of the anchor set, the default) or ram travel over one stroke (gross
 * plus the strand in a jack of `jackGripMm`); with the set it took off. What a perfect reading
 * would measure, asked of the same judge the server uses, with the tendon's own basis.
 */
export async function predictionAsRead(
  db: Db,
  input: { projectId: string; tendonId: string; method?: "marks" | "strokes"; jackGripMm?: number | null },
): Promise<{ mm: number; setMm: number }> {
  const basis = await loadTendonBasis(db, input);
  const probe = judgeStressing({
    project: basis.project,
    tendon: basis.tendon,
    lot: basis.lot,
    sets: [{ id: "s", name: "s", jackGripMm: input.jackGripMm ?? null, maxForceN: null, calibrations: [] }],
    records: [
      {
        id: "p",
        chainId: "p",
        revision: 1,
        end: "A",
        deviceTime: "2026-12-01T16:00:00Z",
        equipmentSetId: "s",
        calibrationId: null,
        expiredCalibrationReason: null,
        readingMethod: input.method ?? "marks",
        initialPressureMPa: null,
        finalPressureMPa: 30,
        measuredMm: 100,
        strokeCount: 1,
        drawInMm: null,
        seatingMm: null,
        stressingOrder: null,
        wireBreaks: 0,
      },
    ],
  });
  return { mm: probe.ends[0]!.predictedMm, setMm: probe.ends[0]!.setMm };
}
