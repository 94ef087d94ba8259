// Claims one notification, says so, then hangs inside "sending" until it is killed: a
// dispatcher that dies mid-send. Used by tests/integration/notifications.test.ts.
import { createDb } from "@/db/connect";
import { dispatchOne } from "@/lib/server/dispatch-notifications";

const db = createDb(process.env.DATABASE_URL!, 1);
await dispatchOne(db, async () => {
  process.stdout.write("claimed\n");
  await new Promise(() => {});
});
