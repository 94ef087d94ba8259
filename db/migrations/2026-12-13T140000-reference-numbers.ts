import { sql, type Kysely } from "kysely";

// Frozen. A flag's and a disposition's reference ("F-0012", "D-0007") is a number kept on the row,
// given once at insert and never changed. It used to be counted at read time in (created_at, id)
// order, so a flag written by a transaction that began earlier but committed later could move the
// numbers of flags already named in an e-mail or a signed report. Existing rows keep the numbers
// they were shown with (the same order); a trigger gives each new row the project's next number
// under a per-project transaction lock, so two writers never take the same one.

const TABLES = ["flags", "dispositions"] as const;

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function assign_reference_number() returns trigger language plpgsql as $$
    begin
      if new.number is null then
        perform pg_advisory_xact_lock(hashtextextended(tg_table_name || ':' || new.project_id::text, 0));
        execute format('select coalesce(max(number), 0) + 1 from %I where project_id = $1', tg_table_name)
          into new.number using new.project_id;
      end if;
      return new;
    end $$`.execute(db);

  for (const table of TABLES) {
    await db.schema.alterTable(table).addColumn("number", "integer").execute();
    // Dispositions refuse updates; the numbering of the rows already there is the one exception.
    if (table === "dispositions")
      await sql`alter table dispositions disable trigger dispositions_append_only`.execute(db);
    await sql`
      update ${sql.id(table)} t set number = s.n
      from (select id, row_number() over (partition by project_id order by created_at, id) as n from ${sql.id(table)}) s
      where t.id = s.id`.execute(db);
    if (table === "dispositions")
      await sql`alter table dispositions enable trigger dispositions_append_only`.execute(db);
    await sql`alter table ${sql.id(table)} alter column number set not null`.execute(db);
    await sql`alter table ${sql.id(table)} add constraint ${sql.id(`${table}_project_number`)} unique (project_id, number)`.execute(
      db,
    );
    await sql`create trigger ${sql.id(`${table}_reference_number`)} before insert on ${sql.id(table)}
      for each row execute function assign_reference_number()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of TABLES) {
    await sql`drop trigger ${sql.id(`${table}_reference_number`)} on ${sql.id(table)}`.execute(db);
    await db.schema.alterTable(table).dropColumn("number").execute();
  }
  await sql`drop function assign_reference_number()`.execute(db);
}
