import { sql, type Kysely } from "kysely";

// Frozen. A pour's status is no longer a column anyone can set: it follows from its records and
// its release. A release can be reopened by the engineer with a reason (append-only, like the
// release), after which the pour may be released again; while a release stands, the pour takes
// no new record and no new or changed tendon (triggers refuse them, whatever path they come by).

export async function up(db: Kysely<any>): Promise<void> {
  // A pour reopened and released again has two releases.
  await sql`alter table releases drop constraint releases_pour_id_key`.execute(db);
  await db.schema.createIndex("releases_pour_id").on("releases").column("pour_id").execute();

  await db.schema
    .createTable("pour_reopenings")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("release_id", "uuid", (c) => c.notNull().unique().references("releases.id").onDelete("cascade"))
    .addColumn("reopened_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("reopened_by_name", "text", (c) => c.notNull())
    .addColumn("reason", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create trigger pour_reopenings_append_only before update or delete on pour_reopenings
    for each row execute function refuse_change()`.execute(db);

  await sql`alter table pours drop column status`.execute(db);

  // The one definition of a pour's status: released while a release stands (not reopened);
  // stressed when every scheduled end of every tendon has a record; stressing from the first
  // record; planned before.
  await sql`
    create view pour_states as
    select
      p.id as pour_id,
      p.project_id,
      case
        when rel.id is not null then 'released'
        when exists (select 1 from tendons t where t.pour_id = p.id)
          and not exists (
            select 1 from tendons t
            cross join lateral unnest(case t.ends when 'both' then array['A', 'B'] else array[t.ends] end) as e(tendon_end)
            where t.pour_id = p.id
              and not exists (select 1 from records r where r.tendon_id = t.id and r.tendon_end = e.tendon_end)
          ) then 'stressed'
        when exists (select 1 from records r where r.pour_id = p.id) then 'stressing'
        else 'planned'
      end as status,
      rel.id as release_id,
      rel.released_by_name,
      rel.created_at as released_at,
      rel.statement as release_statement,
      reo.reopened_by_name as last_reopened_by_name,
      reo.created_at as last_reopened_at,
      reo.reason as last_reopen_reason
    from pours p
    left join lateral (
      select r.id, r.released_by_name, r.created_at, r.statement
      from releases r
      where r.pour_id = p.id and not exists (select 1 from pour_reopenings o where o.release_id = r.id)
      order by r.created_at desc
      limit 1
    ) rel on true
    left join lateral (
      select o.reopened_by_name, o.created_at, o.reason
      from pour_reopenings o
      where o.pour_id = p.id
      order by o.created_at desc
      limit 1
    ) reo on true`.execute(db);

  // Takes a share lock on the pour, so a release (which locks the pour for update) either
  // commits first and is seen here, or waits for this write's transaction to end.
  await sql`
    create function refuse_write_to_released_pour() returns trigger language plpgsql as $$
    begin
      perform 1 from pours where id = new.pour_id for share;
      if exists (
        select 1 from releases r
        where r.pour_id = new.pour_id and not exists (select 1 from pour_reopenings o where o.release_id = r.id)
      ) then
        raise exception 'the pour is released; the engineer must reopen it first' using errcode = 'TL423', hint = tg_table_name;
      end if;
      return new;
    end $$`.execute(db);
  await sql`create trigger records_pour_not_released before insert on records
    for each row execute function refuse_write_to_released_pour()`.execute(db);
  await sql`create trigger tendons_pour_not_released before insert or update on tendons
    for each row execute function refuse_write_to_released_pour()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger tendons_pour_not_released on tendons`.execute(db);
  await sql`drop trigger records_pour_not_released on records`.execute(db);
  await sql`drop function refuse_write_to_released_pour()`.execute(db);
  await sql`drop view pour_states`.execute(db);
  await sql`alter table pours add column status text not null default 'planned'
    check (status in ('planned', 'stressing', 'released'))`.execute(db);
  await sql`update pours set status = 'released' where exists (select 1 from releases r where r.pour_id = pours.id)`.execute(
    db,
  );
  await db.schema.dropTable("pour_reopenings").execute();
  await db.schema.dropIndex("releases_pour_id").execute();
  await sql`alter table releases add constraint releases_pour_id_key unique (pour_id)`.execute(db);
}
