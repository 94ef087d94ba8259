// The e-mail dispatcher: drains the notifications outbox at start (what a crash left behind),
// then every few seconds, until stopped. Started beside the app by `npm start` (which restarts it
// if it ever dies) and `npm test`. A lost database connection or a PostgreSQL restart never ends
// it: the pool has an error listener (db/connect.ts), a failed pass is logged and retried with
// exponential backoff (1 s doubling to 30 s), and every good pass stamps a heartbeat that
// /api/health and the engineer's and admin's screens read. Each pass first queues the shift
// digests of shifts that have ended (lib/server/queue-shift-digests.ts) and the inspectors'
// gauge checks of pours judged since the last pass (lib/server/queue-gauge-checks.ts). Once an hour it also
// deletes uploads that were never confirmed within a day.
import { createDb } from "@/db/connect";
import { env } from "@/lib/env";
import { backoffDelayMs } from "@/lib/retry/backoff";
import { drainNotifications } from "@/lib/server/dispatch-notifications";
import { queueGaugeChecks } from "@/lib/server/queue-gauge-checks";
import { queueShiftDigests } from "@/lib/server/queue-shift-digests";
import { recordHeartbeat, recordWorkerError } from "@/lib/server/record-heartbeat";
import { cleanPendingUploads } from "@/lib/storage";

const INTERVAL_MS = Number(process.env.DISPATCH_INTERVAL_MS ?? 3000);
const MAX_BACKOFF_MS = 30_000;
/** Unconfirmed uploads older than a day are cleaned this often. */
const CLEAN_EVERY_MS = 60 * 60_000;
let lastCleanAt = 0;
const db = createDb(env.DATABASE_URL, 2);
let stopping = false;
let failures = 0;
let wake: (() => void) | undefined;

const log = (message: string) => console.log(`${new Date().toISOString()} ${message}`);

/** One pass; returns how long to wait before the next. */
async function tick(): Promise<number> {
  try {
    // Digests of shifts that have ended go in the outbox first, so this pass sends them.
    const digests = await queueShiftDigests(db);
    if (digests) log(`queued ${digests} shift digest${digests > 1 ? "s" : ""}`);
    const gauges = await queueGaugeChecks(db);
    if (gauges) log(`queued ${gauges} gauge check${gauges > 1 ? "s" : ""}`);
    const sent = await drainNotifications(db);
    await recordHeartbeat(db, "dispatcher");
    if (sent) log(`sent ${sent} e-mail${sent > 1 ? "s" : ""}`);
    if (Date.now() - lastCleanAt >= CLEAN_EVERY_MS) {
      lastCleanAt = Date.now();
      const cleaned = await cleanPendingUploads(db).catch((e: unknown) => {
        log(`cleaning unconfirmed uploads failed: ${e instanceof Error ? e.message : String(e)}`);
        return 0;
      });
      if (cleaned) log(`deleted ${cleaned} upload${cleaned > 1 ? "s" : ""} never confirmed within a day`);
    }
    if (failures) log(`database reachable again after ${failures} failed pass${failures > 1 ? "es" : ""}`);
    failures = 0;
    return INTERVAL_MS;
  } catch (error) {
    failures++;
    const message = error instanceof Error ? error.message : String(error);
    const wait = backoffDelayMs(failures, { baseMs: 1000, capMs: MAX_BACKOFF_MS, jitter: 0 });
    log(`dispatcher pass failed (${message}); trying again in ${wait} ms`);
    // Best effort: the database may be the thing that is down.
    await recordWorkerError(db, "dispatcher", message).catch(() => undefined);
    return wait;
  }
}

async function loop(): Promise<void> {
  log(`e-mail dispatcher running, every ${INTERVAL_MS} ms`);
  while (!stopping) {
    const wait = await tick();
    if (stopping) break;
    await new Promise<void>((resolve) => {
      wake = resolve;
      setTimeout(resolve, wait);
    });
  }
  await db.destroy();
  log("e-mail dispatcher stopped");
}

const stop = () => {
  stopping = true;
  wake?.();
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
await loop();
