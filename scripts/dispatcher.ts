// The e-mail dispatcher: drains the notifications outbox at start (what a crash left behind),
// then every few seconds, until stopped. Started beside the app by `npm start` and `npm test`.
import { createDb } from "@/db/connect";
import { env } from "@/lib/env";
import { drainNotifications } from "@/lib/server/dispatch-notifications";

const INTERVAL_MS = Number(process.env.DISPATCH_INTERVAL_MS ?? 3000);
const db = createDb(env.DATABASE_URL, 2);
let stopping = false;

async function tick(): Promise<void> {
  try {
    const sent = await drainNotifications(db);
    if (sent) console.log(`${new Date().toISOString()} sent ${sent} e-mail${sent > 1 ? "s" : ""}`);
  } catch (error) {
    console.error("dispatcher pass failed; will try again", error);
  }
}

async function loop(): Promise<void> {
  console.log(`e-mail dispatcher running, every ${INTERVAL_MS} ms`);
  while (!stopping) {
    await tick();
    await new Promise((r) => setTimeout(r, INTERVAL_MS));
  }
  await db.destroy();
}

const stop = () => {
  stopping = true;
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
await loop();
