import { sql, type Kysely } from "kysely";

// Frozen. The append-only tables made after the app role (pour reopenings, signed report revisions)
// get the same treatment as the earlier ones: the app role may insert and read them but neither
// update nor delete rows, and nobody may TRUNCATE them.

const TABLES = ["pour_reopenings", "report_revisions"];

export async function up(db: Kysely<any>): Promise<void> {
  for (const table of TABLES) {
    await sql`revoke update, delete on ${sql.id(table)} from tautline_app`.execute(db);
    await sql`create trigger ${sql.id(`${table}_no_truncate`)} before truncate on ${sql.id(table)}
      for each statement execute function refuse_change()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of TABLES) {
    await sql`drop trigger ${sql.id(`${table}_no_truncate`)} on ${sql.id(table)}`.execute(db);
    await sql`grant update, delete on ${sql.id(table)} to tautline_app`.execute(db);
  }
}
