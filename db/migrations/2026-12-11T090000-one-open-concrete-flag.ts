import { sql, type Kysely } from "kysely";

// Frozen. A pour has at most one open "concrete unconfirmed" flag. Two tendons of a new pour
// evaluated at the same moment each read "no concrete flag yet" and each raised one; the database
// now refuses the second, and the evaluation that loses reads again. Extra open flags raised
// before this migration are closed with a reason naming the one kept (the oldest).

const ONE_OPEN_CONCRETE_FLAG = "flags_one_open_concrete_per_pour";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    update flags f
    set status = 'closed',
        closed_at = now(),
        close_reason = 'A second concrete flag for the same pour; flag ' || keep.id || ' stays open for it.'
    from (
      select distinct on (pour_id) pour_id, id
      from flags
      where kind = 'concrete_unconfirmed' and status <> 'closed'
      order by pour_id, created_at, id
    ) keep
    where f.pour_id = keep.pour_id
      and f.kind = 'concrete_unconfirmed'
      and f.status <> 'closed'
      and f.id <> keep.id`.execute(db);
  await sql`create unique index ${sql.id(ONE_OPEN_CONCRETE_FLAG)} on flags (pour_id)
    where kind = 'concrete_unconfirmed' and status <> 'closed'`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index if exists ${sql.id(ONE_OPEN_CONCRETE_FLAG)}`.execute(db);
}
