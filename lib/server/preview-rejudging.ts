import "server-only";
import type { Db } from "@/db/connect";

/** What a change would do to the stored verdicts and flags, told before the admin confirms it. */
export interface RejudgePreview {
  /** Stressed tendons the change judges again (a new evaluation each). */
  rejudged: number;
  /** Of those, how many get another verdict, and their tags. */
  verdictsChanging: number;
  tags: string[];
  /** Flags the new judgement raises, and open flags it closes (a group band or a wire-loss limit moves these, not verdicts). */
  flagsRaising: number;
  flagsClosing: number;
}

/** Thrown to roll the trial back, carrying what it found. */
class TrialDone extends Error {
  constructor(readonly result: RejudgePreview) {
    super("preview");
  }
}

/**
 * Runs a change exactly as saving it would (same checks, same judge, same refusals) inside a
 * transaction that is always rolled back, and compares the project's latest verdicts and its flags
 * before and after: the answer is what the save then does, and nothing stays written. Shared by
 * the previews of a settings change and of adding, retiring or correcting a calibration.
 */
export async function trialRejudging(
  db: Db,
  projectId: string,
  change: (trx: Db) => Promise<unknown>,
): Promise<RejudgePreview> {
  try {
    await db.transaction().execute(async (trx) => {
      const latest = async () =>
        new Map(
          (
            await trx
              .selectFrom("evaluations as e")
              .innerJoin("tendons", "tendons.id", "e.tendon_id")
              .select(["e.tendon_id", "e.id", "e.verdict", "tendons.tag"])
              .distinctOn("e.tendon_id")
              .where("e.project_id", "=", projectId)
              .where("tendons.project_id", "=", projectId)
              .orderBy("e.tendon_id")
              .orderBy("e.created_at", "desc")
              .orderBy("e.id", "desc")
              .execute()
          ).map((r) => [r.tendon_id, r]),
        );
      const flags = async () =>
        new Map(
          (await trx.selectFrom("flags").select(["id", "status"]).where("project_id", "=", projectId).execute()).map(
            (f) => [f.id, f.status],
          ),
        );
      const [verdictsBefore, flagsBefore] = [await latest(), await flags()];
      await change(trx);
      const [verdictsAfter, flagsAfter] = [await latest(), await flags()];
      const rejudged = [...verdictsAfter.values()].filter((r) => verdictsBefore.get(r.tendon_id)?.id !== r.id);
      const tags = [
        ...new Set(rejudged.filter((r) => verdictsBefore.get(r.tendon_id)?.verdict !== r.verdict).map((r) => r.tag)),
      ].sort();
      const flagsRaising = [...flagsAfter.keys()].filter((id) => !flagsBefore.has(id)).length;
      const flagsClosing = [...flagsBefore].filter(
        ([id, status]) => status === "open" && flagsAfter.get(id) === "closed",
      ).length;
      throw new TrialDone({
        rejudged: rejudged.length,
        verdictsChanging: tags.length,
        tags,
        flagsRaising,
        flagsClosing,
      });
    });
  } catch (error) {
    if (error instanceof TrialDone) return error.result;
    throw error;
  }
  throw new Error("The trial neither finished nor failed.");
}
