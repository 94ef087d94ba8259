import "server-only";
import type { Db } from "@/db/connect";
import type { StrandLotInput } from "@/lib/schemas/strand-lot";
import type { TendonInput } from "@/lib/schemas/tendon";
import { updateStrandLot } from "./update-strand-lot";
import { updateTendon } from "./update-tendon";

/** What saving an edit would do to the stressed tendons, told before the admin saves it. */
export interface EditPreview {
  /** Stressed tendons the edit judges again. */
  rejudged: number;
  /** Of those, the ones whose verdict or deviation would change. */
  verdictsChanging: number;
  /** Open flags the new judgement would close. */
  flagsClosing: number;
}

/** Thrown to undo a dry run's transaction once its answer is known. */
class DryRunDone<T> {
  constructor(readonly value: T) {}
}

/**
 * Runs the edit itself in a transaction that is always rolled back: the answer is what the save
 * would do (the same checks, the same judge, the same refusals), and nothing stays written.
 */
async function dryRun(
  db: Db,
  edit: (trx: Db) => Promise<{ reevaluated: number; changed: number; closedFlags: number }>,
): Promise<EditPreview> {
  try {
    await db.transaction().execute(async (trx) => {
      throw new DryRunDone(await edit(trx));
    });
  } catch (e) {
    if (e instanceof DryRunDone) {
      const r = (e as DryRunDone<{ reevaluated: number; changed: number; closedFlags: number }>).value;
      return { rejudged: r.reevaluated, verdictsChanging: r.changed, flagsClosing: r.closedFlags };
    }
    throw e;
  }
  throw new Error("A dry run ended without its answer.");
}

/** How many stressed tendons a strand lot's edit would judge again, and what would change; writes nothing. */
export function previewStrandLotEdit(
  db: Db,
  input: { projectId: string; strandLotId: string; values: StrandLotInput; by: string },
): Promise<EditPreview> {
  return dryRun(db, (trx) => updateStrandLot(trx, input));
}

/** How many stressed tendons a tendon's schedule edit would judge again, and what would change; writes nothing. */
export function previewTendonEdit(
  db: Db,
  input: { projectId: string; tendonId: string; values: TendonInput; by: string },
): Promise<EditPreview> {
  return dryRun(db, (trx) => updateTendon(trx, input));
}
