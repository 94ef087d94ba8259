import type { PullResponse } from "@/lib/schemas/sync";
import type { FieldDb, LocalRecord } from "./db";

/**
 * Takes a pull (or a pour download) into the tablet's database in one transaction. Rows are
 * stored by id, so a row the server sends twice changes nothing. A server record that this
 * tablet made is marked synced; records made elsewhere are kept as the server has them.
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
  ];
  await db.transaction("rw", tables, async () => {
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
    await db.strandLots.bulkPut(response.strandLots);
    await db.equipmentSets.bulkPut(response.equipmentSets);
    await db.calibrations.bulkPut(response.calibrations);
    await db.evaluations.bulkPut(response.evaluations);
    await db.flags.bulkPut(response.flags);
    // The server's cut of a tendon replaces any cut made here (keyed by tendon).
    await db.tailCuts.bulkPut((response.tailCuts ?? []).map((c) => ({ ...c, syncState: "synced" as const })));
    // The server's lift-off checks, with its result, replace the ones made here (same id).
    await db.liftoffChecks.bulkPut((response.liftoffChecks ?? []).map((c) => ({ ...c, syncState: "synced" as const })));

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
