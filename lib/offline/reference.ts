import type { PullResponse } from "@/lib/schemas/sync";
import type { FieldDb, LocalNotice, LocalRecord } from "./db";
import { noticesFromPull } from "./decision-notices";

/**
 * Takes a pull (or a pour download) into the tablet's database in one transaction. Rows are
 * stored by id, so a row the server sends twice changes nothing. A server record that this
 * tablet made is marked synced; records made elsewhere are kept as the server has them. What the
 * pull changes on pours the tablet already held (a new flag, an engineer's decision, a release or
 * a reopening) is kept as notices until the crew acknowledges them.
 */
export async function applyPull(
  db: FieldDb,
  response: PullResponse,
  options: { pourIds: string[]; downloadedAt?: string },
): Promise<void> {
  const tables = [
    db.projects,
    db.pours,
    db.tendons,
    db.strandLots,
    db.equipmentSets,
    db.calibrations,
    db.records,
    db.evaluations,
    db.flags,
    db.tailCuts,
    db.liftoffChecks,
    db.detensions,
    db.notices,
  ];
  await db.transaction("rw", tables, async () => {
    const arrivedAt = response.serverTime;
    // What the tablet held before: every pour on it (a handful) and the flags the pull sends again.
    const [pourRows, flagRows] = await Promise.all([
      db.pours.toArray(),
      db.flags.bulkGet(response.flags.map((f) => f.id)),
    ]);
    await db.projects.bulkPut(response.projects);
    for (const pour of response.pours) {
      const existing = await db.pours.get(pour.id);
      await db.pours.put({
        ...pour,
        downloadedAt: options.downloadedAt ?? existing?.downloadedAt ?? response.serverTime,
        cursor: response.cursor,
        unavailable: false,
      });
    }
    for (const id of options.pourIds) {
      if (response.unavailable.includes(id)) await db.pours.update(id, { unavailable: true });
      else await db.pours.update(id, { cursor: response.cursor });
    }
    await db.tendons.bulkPut(response.tendons);
    const tendonIds = [...new Set(response.flags.map((f) => f.tendonId))];
    const tendonRows = await db.tendons.bulkGet(tendonIds);
    const notices = noticesFromPull({
      before: {
        pours: new Map(pourRows.flatMap((p) => (p.unavailable ? [] : [[p.id, p] as const]))),
        flags: new Map(flagRows.flatMap((f) => (f ? [[f.id, f] as const] : []))),
      },
      arrived: { pours: response.pours, flags: response.flags },
      tendons: new Map(tendonRows.flatMap((t) => (t ? [[t.id, t] as const] : []))),
    });
    if (notices.length) {
      // A notice already kept (acknowledged or not) is left as it is.
      const kept = new Set((await db.notices.bulkGet(notices.map((n) => n.id))).flatMap((n) => (n ? [n.id] : [])));
      const fresh = new Map(notices.filter((n) => !kept.has(n.id)).map((n) => [n.id, n]));
      await db.notices.bulkAdd(
        [...fresh.values()].map((n): LocalNotice => ({ ...n, arrivedAt, acknowledgedAt: null, acknowledgedBy: null })),
      );
    }
    await db.strandLots.bulkPut(response.strandLots);
    await db.equipmentSets.bulkPut(response.equipmentSets);
    await db.calibrations.bulkPut(response.calibrations);
    await db.evaluations.bulkPut(response.evaluations);
    await db.flags.bulkPut(response.flags);
    // The server's cut of a tendon replaces any cut made here (keyed by tendon).
    await db.tailCuts.bulkPut((response.tailCuts ?? []).map((c) => ({ ...c, syncState: "synced" as const })));
    // The server's lift-off checks, with its result, replace the ones made here (same id).
    await db.liftoffChecks.bulkPut((response.liftoffChecks ?? []).map((c) => ({ ...c, syncState: "synced" as const })));
    // The server's detensions replace the ones recorded here (same id).
    await db.detensions.bulkPut((response.detensions ?? []).map((d) => ({ ...d, syncState: "synced" as const })));

    for (const r of response.records) {
      const mine = await db.records.get(r.id);
      if (mine) {
        if (mine.syncState === "pending") await db.records.update(r.id, { syncState: "synced" });
        continue;
      }
      const { authorName, entered, ...rest } = r;
      const record: LocalRecord = {
        ...rest,
        entered: entered as LocalRecord["entered"],
        expiredCalibrationReason: null,
        deviceTimeZone: "UTC",
        syncState: "synced",
        authorName,
        savedAt: r.deviceTime,
        local: null,
        server: null,
        supersededBy: null,
      };
      await db.records.put(record);
    }
    for (const r of response.records) {
      if (r.baseRecordId) await db.records.update(r.baseRecordId, { supersededBy: r.id });
    }
    for (const gone of response.removed) {
      const table = {
        pours: db.pours,
        tendons: db.tendons,
        strand_lots: db.strandLots,
        equipment_sets: db.equipmentSets,
        calibrations: db.calibrations,
      }[gone.table];
      await table?.delete(gone.id);
    }
  });
}
