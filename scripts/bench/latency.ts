/**
 * The wait users feel for a flag: a record pushed to the server the moment it is saved with signal
 * (one op per push, as a tablet with signal sends it) → stored and evaluated → the flag e-mail in
 * the local inbox. 100 out-of-band records, started 250 ms apart, the inbox polled every 100 ms;
 * prints p50/p95 from the push to the e-mail. The dispatcher runs at its default interval (3 s).
 * What this does not include: the tablet's own wait between "Save record" and its push (the sync
 * client's triggers in lib/offline/sync-client.ts; see docs/PERFORMANCE.md).
 * Starts the app (BENCH_PORT, default 3390) and a dispatcher on a database of its own.
 */
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import {
  assertLoopback,
  makeDatabase,
  noteArrivals,
  percentile,
  pushOps,
  report,
  seedBenchProject,
  signIn,
  startApp,
  startDispatcher,
  tearDown,
  waitForUrl,
} from "./harness";

const RECORDS = 100;
const SPACING_MS = 250;
const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:3391";
const LIMIT_MS = 150_000;

async function main() {
  assertLoopback(INBOX);
  const database = await makeDatabase("bench_latency");
  const db = createDb(database.url, 2);
  const stops: (() => Promise<void>)[] = [];
  try {
    await migrateToLatest(db);
    const bench = await seedBenchProject(db, { code: "LAT", pours: 1, tendonsPerPour: RECORDS, outOfBandEvery: 1 });
    const tags = (
      await db.selectFrom("tendons").select(["id", "tag"]).where("project_id", "=", bench.projectId).execute()
    ).reduce((m, t) => m.set(t.id, t.tag), new Map<string, string>());
    stops.push(startApp(PORT, { DATABASE_URL: database.url }));
    stops.push(
      startDispatcher({ DATABASE_URL: database.url, DISPATCH_INTERVAL_MS: process.env.DISPATCH_INTERVAL_MS ?? "3000" }),
    );
    await waitForUrl(`${BASE}/api/health`);
    const cookie = await signIn(BASE, bench.crewEmail, bench.password);
    await fetch(`${INBOX}/api/messages`, { method: "DELETE" });

    const ops = bench.opsByPour[0]!;
    const pushedAt = new Map<string, number>(); // tendon tag → when its push started
    const arrivedAt = new Map<string, number>();
    let errors = 0;
    const deadline = Date.now() + LIMIT_MS;
    const pushes = ops.map(
      (op, i) =>
        new Promise<void>((resolve) =>
          setTimeout(async () => {
            const tag = tags.get(op.payload.tendonId)!;
            pushedAt.set(tag, performance.now());
            const r = await pushOps(BASE, cookie, "bench-latency-tablet", [op]).catch(() => ({
              status: 0,
              statuses: [] as string[],
            }));
            if (r.status !== 200 || r.statuses[0] !== "applied") errors++;
            resolve();
          }, i * SPACING_MS),
        ),
    );
    while (arrivedAt.size < RECORDS && Date.now() < deadline) {
      await noteArrivals(INBOX, bench.engineerEmail, /P1-\d{4}/, arrivedAt);
      await new Promise((r) => setTimeout(r, 100));
    }
    await Promise.all(pushes);
    const waits = [...arrivedAt].map(([tag, at]) => (at - pushedAt.get(tag)!) / 1000);
    report({
      figure: `flag e-mail after a push with signal, p50 / p95 of ${RECORDS} (server, dispatcher every ${Number(process.env.DISPATCH_INTERVAL_MS ?? 3000) / 1000} s, SMTP)`,
      value: `${percentile(waits, 50).toFixed(1)} / ${percentile(waits, 95).toFixed(1)} s; ${arrivedAt.size} of ${RECORDS} arrived, ${errors} push errors`,
      target: "p95 < 10 s",
      holds: arrivedAt.size === RECORDS && errors === 0 && percentile(waits, 95) < 10,
    });
  } finally {
    await tearDown(stops, db, database);
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
