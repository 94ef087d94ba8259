import "server-only";
import { sql } from "kysely";
import type { Db } from "@/db/connect";
import type { CalibrationInput } from "@/lib/schemas/calibration";
import { correctCalibration } from "./correct-calibration";

/** Thrown to roll the trial back, carrying what it found. */
class TrialDone extends Error {
  constructor(readonly result: CalibrationCorrectionPreview) {
    super("preview");
  }
}

export interface CalibrationCorrectionPreview {
  /** Stressed tendons the correction judges again (a new evaluation each). */
  rejudged: number;
  /** Of those, how many get another verdict, and their tags. */
  verdictsChanging: number;
  tags: string[];
}

/**
 * What correcting a calibration would do to the stored verdicts, without writing anything: the
 * correction runs exactly as it would (same checks, same fit, same re-judging) inside a transaction
 * that is rolled back, and the tendons' latest verdicts before and after are compared. What the
 * admin sees before pressing Correct a second time, as the settings screen does for its preview.
 * Bad figures, a future date or a retired calibration are refused exactly as the correction is.
 */
export async function previewCalibrationCorrection(
  db: Db,
  input: {
    projectId: string;
    setId: string;
    calibrationId: string;
    by: { id: string };
    reason: string;
    values: CalibrationInput;
  },
): Promise<CalibrationCorrectionPreview> {
  try {
    await db.transaction().execute(async (trx) => {
      const latest = () =>
        trx
          .selectFrom("evaluations as e")
          .innerJoin("tendons", "tendons.id", "e.tendon_id")
          .select(["e.tendon_id", "e.verdict", "tendons.tag", "e.created_at"])
          .distinctOn("e.tendon_id")
          .where("e.project_id", "=", input.projectId)
          .where("tendons.project_id", "=", input.projectId)
          .orderBy("e.tendon_id")
          .orderBy("e.created_at", "desc")
          .orderBy("e.id", "desc")
          .execute();
      const before = new Map((await latest()).map((r) => [r.tendon_id, r.verdict]));
      // Evaluations are stamped with clock_timestamp(): those from this moment on are the trial's.
      const { rows } = await sql<{ at: Date }>`select clock_timestamp() as at`.execute(trx);
      const started = rows[0]!.at;
      const { reevaluated } = await correctCalibration(trx, input);
      const written = await trx
        .selectFrom("evaluations as e")
        .innerJoin("tendons", "tendons.id", "e.tendon_id")
        .select(["e.tendon_id", "e.verdict", "tendons.tag"])
        .where("e.project_id", "=", input.projectId)
        .where("e.created_at", ">=", started)
        .execute();
      const tags = [...new Set(written.filter((r) => before.get(r.tendon_id) !== r.verdict).map((r) => r.tag))].sort();
      throw new TrialDone({ rejudged: reevaluated, verdictsChanging: tags.length, tags });
    });
  } catch (error) {
    if (error instanceof TrialDone) return error.result;
    throw error;
  }
  throw new Error("The trial correction neither finished nor failed.");
}
