/**
 * The push's cost per op, in one process (no HTTP, no sign-in): PROFILE_RECORDS records of one pour
 * (default 1,000) pushed through `pushOps` in batches of 50, then replayed (every op answered
 * duplicate). Prints ms per op of wall time and of this process's CPU, so that a profile
 * (`node --cpu-prof`) or `pg_stat_statements` can be read per op.
 *   tsx --conditions=react-server --import ./scripts/bench/support/no-auth-options.mjs scripts/bench/push-profile.ts
 * (TEST_DATABASE_ADMIN_URL as for sync.ts)
 */
import { readdirSync, readFileSync } from "node:fs";
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import { pushOps } from "../../lib/server/push-ops";
import { makeDatabase, seedBenchProject, toSyncOp } from "./harness";

const RECORDS = Number(process.env.PROFILE_RECORDS ?? 1000);
const BATCH = 50;

/**
 * CPU seconds used so far by the backends of the PostgreSQL whose data directory is PROFILE_PG_DATA
 * (a local cluster: its postmaster's children, from /proc), or null without it.
 */
function databaseCpuSeconds(): number | null {
  const data = process.env.PROFILE_PG_DATA;
  if (!data) return null;
  const postmaster = readFileSync(`${data}/postmaster.pid`, "utf8").split("\n")[0]!.trim();
  let ticks = 0;
  for (const pid of readdirSync("/proc").filter((d) => /^\d+$/.test(d))) {
    try {
      const fields = readFileSync(`/proc/${pid}/stat`, "utf8")
        .replace(/^.*\) /, "")
        .split(" ");
      if (fields[1] === postmaster) ticks += Number(fields[11]) + Number(fields[12]);
    } catch {
      // gone meanwhile
    }
  }
  return ticks / 100;
}

async function main() {
  const database = await makeDatabase("bench_profile");
  const setup = createDb(database.url, 2);
  const db = createDb(database.url, Number(process.env.PROFILE_POOL ?? 10), { prepare: true });
  try {
    await migrateToLatest(setup);
    const bench = await seedBenchProject(setup, { code: "PRF", pours: 1, tendonsPerPour: RECORDS, outOfBandEvery: 30 });
    const user = await setup
      .selectFrom("users")
      .select("id")
      .where("email", "=", bench.crewEmail)
      .executeTakeFirstOrThrow();
    const crew = { id: user.id, memberships: [{ projectId: bench.projectId, role: "crew" as const }] };
    const ops = bench.opsByPour[0]!.map(toSyncOp);
    const run = async (label: string, expect: string) => {
      const cpu = process.cpuUsage();
      const dbCpu = databaseCpuSeconds();
      const started = performance.now();
      for (let i = 0; i < ops.length; i += BATCH) {
        const { results } = await pushOps(db, { user: crew, deviceId: "profile-tablet", ops: ops.slice(i, i + BATCH) });
        const off = results.find((r) => r.status !== expect);
        if (off) throw new Error(`${label}: ${JSON.stringify(off)}`);
      }
      const ms = performance.now() - started;
      const used = process.cpuUsage(cpu);
      const dbUsed = dbCpu === null ? null : databaseCpuSeconds()! - dbCpu;
      console.log(
        `${label}: ${(ms / ops.length).toFixed(2)} ms per op wall (${((ops.length / ms) * 1000).toFixed(0)} ops/s), ` +
          `${((used.user + used.system) / 1000 / ops.length).toFixed(2)} ms per op of this process's CPU` +
          (dbUsed === null ? "" : `, ${((dbUsed * 1000) / ops.length).toFixed(2)} ms per op of PostgreSQL's`),
      );
    };
    await run("applied", "applied");
    await run("duplicate", "duplicate");
  } finally {
    await db.destroy();
    await setup.destroy();
    if (!process.env.PROFILE_KEEP) await database.drop();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
