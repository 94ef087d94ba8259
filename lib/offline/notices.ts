import type { FieldDb, LocalNotice } from "./db";

/**
 * The notices a sync brought (kept by applyPull in reference.ts) that the crew has not yet
 * acknowledged: of one pour, or of every pour on the tablet. Oldest arrival first, in the order
 * the diff gave them within one arrival.
 */
export async function openNotices(db: FieldDb, pourId?: string): Promise<LocalNotice[]> {
  const rows = pourId ? await db.notices.where("pourId").equals(pourId).toArray() : await db.notices.toArray();
  return rows
    .filter((n) => n.acknowledgedAt === null)
    .sort(
      (a, b) =>
        a.arrivedAt.localeCompare(b.arrivedAt) ||
        a.pourName.localeCompare(b.pourName) ||
        (a.tendonTag ?? "").localeCompare(b.tendonTag ?? "") ||
        a.at.localeCompare(b.at),
    );
}

/** The crew has read these notices: they stay on the tablet, marked with who and when, and are shown no more. */
export async function acknowledgeNotices(
  db: FieldDb,
  ids: string[],
  by: string,
  at: string = new Date().toISOString(),
): Promise<number> {
  return db.transaction("rw", db.notices, async () => {
    let changed = 0;
    for (const id of ids) {
      changed += await db.notices
        .where("id")
        .equals(id)
        .and((n) => n.acknowledgedAt === null)
        .modify({ acknowledgedAt: at, acknowledgedBy: by });
    }
    return changed;
  });
}
