import { sql, type Kysely, type RawBuilder } from "kysely";

// Frozen. The same pour_states view, columns and meaning, in a form PostgreSQL restricts to the
// pours a statement asks for. Before, its "every scheduled end has a record" test was a NOT EXISTS
// that the planner costed as if it stopped at the first unrecorded end: it read the tendons table
// whole to keep the pour's (a stressed pour has no such end, so the whole pour was checked), and it
// looked each end's record up in records_tendon_idx, whose leading column is the project, so each
// look-up walked the whole index. Now the pour's scheduled ends are counted in a LATERAL subquery
// keyed by the pour's id (through tendons_pour_change_idx), each end's record is found through a
// new index on (tendon_id, tendon_end), and a released pour (the first case) skips the count.

/**
 * The view with the given "stressed" test, and what it reads from beside the pour and its
 * standing release and last reopening: released while a release stands (not reopened); stressed
 * when the test holds; stressing from the first record; planned before.
 */
function pourStates(stressed: RawBuilder<unknown>, alsoFrom: RawBuilder<unknown>) {
  return sql`
    create or replace view pour_states as
    select
      p.id as pour_id,
      p.project_id,
      case
        when rel.id is not null then 'released'
        when ${stressed} then 'stressed'
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
    ) reo on true
    ${alsoFrom}`;
}

/** The ends a tendon is stressed at, one row each. */
const SCHEDULED_ENDS = sql`unnest(case t.ends when 'both' then array['A', 'B'] else array[t.ends] end) as e(tendon_end)`;

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createIndex("records_tendon_end_idx").on("records").columns(["tendon_id", "tendon_end"]).execute();
  // Stressed: the pour has tendons and every scheduled end of every tendon has a record.
  await pourStates(
    sql`ends.scheduled > 0 and ends.unrecorded = 0`,
    sql`cross join lateral (
      select count(*) as scheduled, count(*) filter (where recorded.one is null) as unrecorded
      from tendons t
      cross join lateral ${SCHEDULED_ENDS}
      left join lateral (
        select 1 as one from records r where r.tendon_id = t.id and r.tendon_end = e.tendon_end limit 1
      ) recorded on true
      where t.pour_id = p.id and rel.id is null
    ) ends`,
  ).execute(db);
}

/** The definition of 2026-12-10T020000-pour-release-states. */
export async function down(db: Kysely<any>): Promise<void> {
  await pourStates(
    sql`exists (select 1 from tendons t where t.pour_id = p.id)
      and not exists (
        select 1 from tendons t
        cross join lateral ${SCHEDULED_ENDS}
        where t.pour_id = p.id
          and not exists (select 1 from records r where r.tendon_id = t.id and r.tendon_end = e.tendon_end)
      )`,
    sql``,
  ).execute(db);
  await db.schema.dropIndex("records_tendon_end_idx").execute();
}
