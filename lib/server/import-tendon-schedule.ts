import "server-only";
import type { Db } from "@/db/connect";
import { parseTendonSchedule, type ScheduleError } from "@/lib/csv/tendon-schedule";
import { AppError, type FieldErrors } from "@/lib/errors";
import { recordAudit } from "./record-audit";
import { lockOpenPour } from "./require-open-pour";

/** Field key of one schedule error, as the import screen lists them: "line 3 · strands". */
export function scheduleErrorKey(e: ScheduleError): string {
  return e.row === 0 ? "file" : `line ${e.row}${e.column ? ` · ${e.column}` : ""}`;
}

/**
 * Imports a schedule file into a pour: all or nothing. The file is checked whole (every error
 * by line and column, tags against the pour, lots against the project) inside one transaction
 * that also writes the rows, so nothing is written unless every row is good.
 */
export async function importTendonSchedule(
  db: Db,
  input: { projectId: string; pourId: string; csv: string; by: string },
): Promise<{ imported: number }> {
  return db.transaction().execute(async (trx) => {
    await lockOpenPour(trx, input);
    const existing = await trx
      .selectFrom("tendons")
      .select("tag")
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .execute();
    const lots = await trx
      .selectFrom("strand_lots")
      .select(["id", "lot_number", "strand_size"])
      .where("project_id", "=", input.projectId)
      .execute();
    const result = parseTendonSchedule(input.csv, {
      existingTags: new Set(existing.map((t) => t.tag.toLowerCase())),
      lotNumbers: new Set(lots.map((l) => l.lot_number)),
    });
    const errors: ScheduleError[] = result.ok ? [] : [...result.errors];
    if (result.ok) {
      result.tendons.forEach((t, i) => {
        const lot = t.strandLot ? lots.find((l) => l.lot_number === t.strandLot) : undefined;
        if (lot && lot.strand_size !== t.strandSize)
          errors.push({
            row: i + 2,
            column: "strand lot",
            message: `Lot ${lot.lot_number} is ${lot.strand_size} strand, not ${t.strandSize}.`,
          });
      });
    }
    if (errors.length || !result.ok) {
      const fields: FieldErrors = {};
      for (const e of errors) (fields[scheduleErrorKey(e)] ??= []).push(e.message);
      throw new AppError(
        "INVALID_INPUT",
        `The file has ${errors.length}${errors.length >= 200 ? " or more" : ""} problem${errors.length === 1 ? "" : "s"}; nothing was imported.`,
        fields,
      );
    }
    const lotId = new Map(lots.map((l) => [l.lot_number, l.id]));
    const CHUNK = 1000;
    for (let i = 0; i < result.tendons.length; i += CHUNK) {
      await trx
        .insertInto("tendons")
        .values(
          result.tendons.slice(i, i + CHUNK).map((t) => ({
            project_id: input.projectId,
            pour_id: input.pourId,
            tag: t.tag,
            kind: t.kind,
            strand_size: t.strandSize,
            strand_count: t.strandCount,
            segments: JSON.stringify(t.segments),
            ends: t.ends,
            jack_grip_mm: t.jackGripMm,
            shop_elongation_mm: t.shopElongationMm,
            strand_lot_id: t.strandLot ? (lotId.get(t.strandLot) ?? null) : null,
            member: t.member ?? null,
            stressing_order: t.stressingOrder ?? null,
            jacking_force_n: t.jackingForceN ?? null,
          })),
        )
        .execute();
    }
    await recordAudit(trx, {
      action: "schedule.import",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      target: input.pourId,
      detail: { tendons: result.tendons.length },
    });
    return { imported: result.tendons.length };
  });
}
