import { sql, type Kysely } from "kysely";

// Frozen. A version per tendon, raised by every write that stores a record of it and evaluates
// it again. The sync push reads the version with the tendon's state and stores the record, the
// evaluation and its op claim in one statement that raises the version only from the value it
// read (optimistic concurrency): when another write got there first, the statement refuses as a
// whole through sync_write_guard and the push reads the state again.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("tendon_versions")
    .addColumn("tendon_id", "uuid", (c) => c.primaryKey().references("tendons.id").onDelete("cascade"))
    .addColumn("version", "integer", (c) => c.notNull())
    .execute();

  // Refuses the statement it ends unless its op claim, version raise and record insert each
  // wrote one row; the hint says which did not.
  await sql`
    create function sync_write_guard(claimed bigint, raised bigint, stored bigint) returns integer
    language plpgsql as $$
    begin
      if claimed <> 1 then
        raise exception 'the operation was already applied' using errcode = 'TL409', hint = 'claim';
      end if;
      if raised <> 1 then
        raise exception 'the tendon changed since it was read' using errcode = 'TL409', hint = 'tendon';
      end if;
      if stored <> 1 then
        raise exception 'a record with this id or revision is already stored' using errcode = 'TL409', hint = 'record';
      end if;
      return 1;
    end $$`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop function sync_write_guard(bigint, bigint, bigint)`.execute(db);
  await db.schema.dropTable("tendon_versions").execute();
}
