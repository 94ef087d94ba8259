import { afterEach } from "vitest";
import { testDb } from "@/lib/offline/test-support";

/**
 * For a unit test file of the tablet's storage: returns `freshDb`, which opens a new tablet
 * database on fake-indexeddb; every database it opened is closed after each test.
 */
export function tabletDbsClosedAfterEach(): () => ReturnType<typeof testDb>["db"] {
  const opened: ReturnType<typeof testDb>[] = [];
  afterEach(() => {
    for (const t of opened.splice(0)) t.db.close();
  });
  return () => {
    const t = testDb();
    opened.push(t);
    return t.db;
  };
}
