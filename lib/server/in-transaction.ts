import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "@/db/types";

/** Runs in the caller's transaction when there is one (a seed, a sync batch), else in a new one. */
export function inTransaction<T>(db: Kysely<Database>, fn: (trx: Transaction<Database>) => Promise<T>): Promise<T> {
  return db.isTransaction ? fn(db as Transaction<Database>) : db.transaction().execute(fn);
}
