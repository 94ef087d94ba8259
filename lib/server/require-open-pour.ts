import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";

/** The SQLSTATE the database raises when a write reaches a released pour (its triggers). */
export const RELEASED_POUR_SQLSTATE = "TL423";

export const RELEASED_POUR_MESSAGE =
  "This pour is released: it takes no new record or tendon unless the engineer of record reopens it.";

/** True when a database error is the released-pour trigger refusing a write. */
export function isReleasedPourRefusal(error: unknown): boolean {
  return (error as { code?: unknown } | null)?.code === RELEASED_POUR_SQLSTATE;
}

/**
 * Refuses when the pour stands released. Call it after locking the pour's row; the database's
 * triggers refuse the same writes whatever path they come by.
 */
export async function requireOpenPour(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<void> {
  const state = await db
    .selectFrom("pour_states")
    .select("status")
    .where("project_id", "=", input.projectId)
    .where("pour_id", "=", input.pourId)
    .executeTakeFirst();
  if (state?.status === "released") throw new AppError("CONFLICT", RELEASED_POUR_MESSAGE);
}

/**
 * Locks the pour's row for the rest of the transaction (it serialises the pour's schedule writers,
 * its release and its reopening); refuses a pour that is not the project's.
 */
export async function lockPour(trx: Kysely<Database>, input: { projectId: string; pourId: string }): Promise<void> {
  const pour = await trx
    .selectFrom("pours")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.pourId)
    .forUpdate()
    .executeTakeFirst();
  if (!pour) throw new AppError("NOT_FOUND", "No such pour on this project.");
}

/** Locks the pour's row, then refuses when it stands released: what every schedule write does first. */
export async function lockOpenPour(trx: Kysely<Database>, input: { projectId: string; pourId: string }): Promise<void> {
  await lockPour(trx, input);
  await requireOpenPour(trx, input);
}
