/**
 * The reads that may be a moment old, served by the replica: after the load, an engineer of the
 * 500-tendon pour's project opens its insight page and the project's read-only status board, a
 * batch of each through the proxy, while the replica's committed transactions are counted
 * (pg_stat_database.xact_commit before and after). The app servers read those pages through
 * DATABASE_REPLICA_URL (db/moment-old.ts); nothing else in the run reads the replica, so the count
 * rises only if they do.
 *   tsx scripts/scale/replica-reads.ts BASE PRIMARY_URL REPLICA_URL
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { sql, type Kysely } from "kysely";
import { createDb } from "../../db/connect";
import { assertLoopback, percentile, report, signIn } from "../bench/harness";

const [base, primaryUrl, replicaUrl] = process.argv.slice(2);
if (!base || !primaryUrl || !replicaUrl) throw new Error("usage: replica-reads.ts BASE PRIMARY_URL REPLICA_URL");
assertLoopback(base);
for (const u of [primaryUrl, replicaUrl]) assertLoopback(u.replace(/^postgres(ql)?:/, "http:"));
const primary = createDb(primaryUrl, 1);
const replica = createDb(replicaUrl, 1) as unknown as Kysely<unknown>;
const BATCH = 20;

/** Transactions committed on the replica's database so far. */
const committed = async () =>
  (
    await sql<{
      n: number;
    }>`select xact_commit::bigint as n from pg_stat_database where datname = current_database()`.execute(replica)
  ).rows[0]!.n;

/** PostgreSQL sends a backend's counts to pg_stat_database when it is idle, within 10 s (PGSTAT_IDLE_INTERVAL). */
const settle = () => new Promise((r) => setTimeout(r, 11_000));

try {
  // The pour with the most tendons (the load's 500-tendon pour) and a reader of its own on the project.
  const pour = await primary
    .selectFrom("tendons")
    .select(["project_id as projectId", "pour_id as pourId", (eb) => eb.fn.countAll<number>().as("n")])
    .groupBy(["project_id", "pour_id"])
    .orderBy("n", "desc")
    .executeTakeFirstOrThrow();
  const password = randomBytes(12).toString("hex");
  const email = `reader-${randomBytes(4).toString("hex")}@bench.tautline.test`;
  const user = await primary
    .insertInto("users")
    .values({
      email,
      name: "Bench reader",
      password_hash: await bcrypt.hash(password, 10),
      email_verified: new Date(),
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await primary
    .insertInto("project_members")
    .values({ project_id: pour.projectId, user_id: user.id, role: "engineer" })
    .execute();
  const cookie = await signIn(base, email, password);
  const made = await fetch(`${base}/api/projects/${pour.projectId}/share-links`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base, cookie },
    body: JSON.stringify({ label: "Scale run reader", days: 1 }),
  });
  if (made.status !== 201) throw new Error(`making a read-only link answered ${made.status}`);
  const token = ((await made.json()) as { url: string }).url.split("/share/")[1]!;

  const pages = [
    { name: "insight page", path: `/projects/${pour.projectId}/pours/${pour.pourId}/insight`, cookie },
    { name: "status board", path: `/share/${token}`, cookie: "" },
  ];
  // One of each first, not counted: the pages' first render and the replica pools' connections.
  for (const p of pages) await fetch(`${base}${p.path}`, { headers: { cookie: p.cookie } }).then((r) => r.text());
  await settle();

  for (const p of pages) {
    const before = await committed();
    const ms: number[] = [];
    for (let i = 0; i < BATCH; i++) {
      const started = performance.now();
      const res = await fetch(`${base}${p.path}`, {
        headers: { cookie: p.cookie },
        signal: AbortSignal.timeout(60_000),
      });
      await res.text();
      if (res.status !== 200) throw new Error(`the ${p.name} answered ${res.status}`);
      ms.push(performance.now() - started);
    }
    await settle();
    // Less this script's own counting query before the batch (the one after is not yet counted).
    const served = (await committed()) - before - 1;
    report({
      figure: `replica: transactions committed there during ${BATCH} ${p.name} loads (pg_stat_database.xact_commit)`,
      value: `${served} (${(served / BATCH).toFixed(1)} a load); load p50 / p95 ${percentile(ms, 50).toFixed(0)} / ${percentile(ms, 95).toFixed(0)} ms`,
      target: `≥ ${BATCH}`,
      holds: served >= BATCH,
    });
  }
} finally {
  await primary.destroy();
  await replica.destroy();
}
