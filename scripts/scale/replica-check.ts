/**
 * The streaming replica after a load: does it hold the same records and notifications as the
 * primary, and how long does a fresh write take to become readable on it (bounded: 10 s)?
 *   tsx scripts/scale/replica-check.ts PRIMARY_URL REPLICA_URL
 */
import { sql, type Kysely } from "kysely";
import { createDb } from "../../db/connect";
import { assertLoopback, percentile, report } from "../bench/harness";

const [primaryUrl, replicaUrl] = process.argv.slice(2);
if (!primaryUrl || !replicaUrl) throw new Error("usage: replica-check.ts PRIMARY_URL REPLICA_URL");
for (const u of [primaryUrl, replicaUrl]) assertLoopback(u.replace(/^postgres(ql)?:/, "http:"));
const primary = createDb(primaryUrl, 1) as unknown as Kysely<unknown>;
const replica = createDb(replicaUrl, 1) as unknown as Kysely<unknown>;

const counts = (db: Kysely<unknown>) =>
  sql<{
    records: number;
    notifications: number;
  }>`select (select count(*) from records) as records, (select count(*) from notifications where status = 'sent') as notifications`
    .execute(db)
    .then((r) => r.rows[0]!);

try {
  await sql`create table if not exists scale_probe (n int primary key, at timestamptz not null default clock_timestamp())`.execute(
    primary,
  );
  const lagMs: number[] = [];
  for (let n = 1; n <= 20; n++) {
    await sql`insert into scale_probe (n) values (${n}) on conflict (n) do update set at = clock_timestamp()`.execute(
      primary,
    );
    const started = performance.now();
    const until = Date.now() + 10_000;
    let seen = false;
    while (!seen && Date.now() < until) {
      seen =
        (await sql<{ n: number }>`select count(*) as n from pg_class where relname = 'scale_probe'`.execute(replica))
          .rows[0]!.n > 0 &&
        (await sql<{ n: number }>`select count(*) as n from scale_probe where n = ${n}`.execute(replica)).rows[0]!.n >
          0;
      if (!seen) await new Promise((r) => setTimeout(r, 2));
    }
    lagMs.push(seen ? performance.now() - started : Number.POSITIVE_INFINITY);
  }
  await sql`drop table scale_probe`.execute(primary);
  const a = await counts(primary);
  // Give the replica a moment to replay the last of the load before comparing.
  let b = await counts(replica);
  for (let i = 0; i < 50 && (b.records !== a.records || b.notifications !== a.notifications); i++) {
    await new Promise((r) => setTimeout(r, 100));
    b = await counts(replica);
  }
  report({
    figure: "replica: records and sent e-mails match the primary",
    value: `${b.records}/${a.records} records, ${b.notifications}/${a.notifications} sent`,
    target: "equal",
    holds: a.records === b.records && a.notifications === b.notifications,
  });
  report({
    figure: "replica: a write readable there after, p50 / max of 20",
    value: `${percentile(lagMs, 50).toFixed(1)} / ${Math.max(...lagMs).toFixed(1)} ms`,
    target: "",
    holds: null,
  });
} finally {
  await primary.destroy();
  await replica.destroy();
}
