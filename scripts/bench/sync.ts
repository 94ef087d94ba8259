/**
 * Sync push throughput: 1,000 records pushed in batches of 50 through the real route of a
 * running Tautline (`next start` on a throwaway database, started here), against inserting the
 * same rows with plain per-row transactions through Kysely in the same run. Each pushed op also
 * claims its op id, checks the tendon, set and calibration, writes the audit row and runs the
 * server evaluation, so the ratio prices what exactly-once and the verdict cost. Figures only.
 *
 *   npm run build && npx tsx scripts/bench/sync.ts      (BENCH_PORT, TEST_DATABASE_ADMIN_URL optional)
 */
import { uuidv7 } from "uuidv7";
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import { makeDatabase, pushOps, report, seedBenchProject, signIn, startApp, waitForUrl } from "./harness";

const RECORDS = 1_000;
const BATCH = 50;
const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;

async function main() {
  const database = await makeDatabase("bench_sync");
  const db = createDb(database.url, 5);
  let stop = async () => {};
  try {
    await migrateToLatest(db);
    // One pour of 1,000 straight one-end tendons, every record in band (the bench project is invented).
    const bench = await seedBenchProject(db, { code: "BNC", pours: 1, tendonsPerPour: RECORDS, outOfBandEvery: 0 });
    stop = startApp(PORT, { DATABASE_URL: database.url });
    await waitForUrl(`${BASE}/api/health`);
    const cookie = await signIn(BASE, bench.crewEmail, bench.password);
    const deviceId = "bench-tablet-0001";
    const ops = bench.opsByPour[0]!;

    // Warm the route once (compilation of the handler, the pool) with an op the server refuses.
    await pushOps(BASE, cookie, deviceId, [
      { ...ops[0]!, opId: crypto.randomUUID(), recordId: crypto.randomUUID(), payload: {} as never },
    ]);

    const started = performance.now();
    let applied = 0;
    for (let i = 0; i < ops.length; i += BATCH) {
      const res = await pushOps(BASE, cookie, deviceId, ops.slice(i, i + BATCH));
      if (res.status !== 200) throw new Error(`push answered ${res.status}`);
      applied += res.statuses.filter((s) => s === "applied").length;
    }
    const pushSeconds = (performance.now() - started) / 1000;
    if (applied !== RECORDS) throw new Error(`only ${applied} of ${RECORDS} ops were applied`);

    // Replaying every batch: the duplicate path.
    const replayStart = performance.now();
    for (let i = 0; i < ops.length; i += BATCH) await pushOps(BASE, cookie, deviceId, ops.slice(i, i + BATCH));
    const replaySeconds = (performance.now() - replayStart) / 1000;

    // The same rows, new ids, one plain transaction per row.
    const plainStart = performance.now();
    for (const { payload } of ops) {
      const id = uuidv7();
      await db.transaction().execute((trx) =>
        trx
          .insertInto("records")
          .values({
            id,
            project_id: payload.projectId,
            pour_id: payload.pourId,
            tendon_id: payload.tendonId,
            tendon_end: payload.tendonEnd,
            chain_id: id,
            revision: 1,
            equipment_set_id: payload.equipmentSetId,
            calibration_id: payload.calibrationId,
            initial_pressure_mpa: payload.initialPressureMPa,
            final_pressure_mpa: payload.finalPressureMPa,
            reading_method: payload.readingMethod,
            entered: JSON.stringify(payload.entered),
            measured_mm: payload.measuredMm,
            seating_mm: payload.seatingMm,
            wire_breaks: payload.wireBreaks,
            remarks: payload.remarks,
            device_time: payload.deviceTime,
            device_time_zone: payload.deviceTimeZone,
            device_id: deviceId,
            author_user_id: payload.authorUserId,
          })
          .execute(),
      );
    }
    const plainSeconds = (performance.now() - plainStart) / 1000;

    const rows = await db
      .selectFrom("records")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .where("device_id", "=", deviceId)
      .executeTakeFirstOrThrow();
    const pushRate = RECORDS / pushSeconds;
    const plainRate = RECORDS / plainSeconds;
    console.log(`sync push: ${RECORDS} records in batches of ${BATCH} through POST /api/sync/push`);
    console.log(`  push (applied, with evaluation):   ${pushRate.toFixed(0)} records/s  (${pushSeconds.toFixed(2)} s)`);
    console.log(
      `  replay of the same batches:         ${(RECORDS / replaySeconds).toFixed(0)} ops/s answered duplicate  (${replaySeconds.toFixed(2)} s)`,
    );
    console.log(
      `  plain per-row Kysely transactions:  ${plainRate.toFixed(0)} records/s  (${plainSeconds.toFixed(2)} s)`,
    );
    console.log(`  ratio push / plain:                 ${(pushRate / plainRate).toFixed(2)}  (target at least 0.5)`);
    console.log(`  rows stored: ${rows.n} (expected ${2 * RECORDS}: each pushed record once, plus the plain copies)`);
    report({
      figure: "sync push, one tablet, batches of 50",
      value: `${pushRate.toFixed(0)} records/s`,
      target: "",
      holds: null,
    });
    report({
      figure: "sync push / plain per-row inserts",
      value: (pushRate / plainRate).toFixed(2),
      target: "≥ 0.50",
      holds: pushRate / plainRate >= 0.5,
    });
  } finally {
    await stop();
    await db.destroy();
    await database.drop();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
