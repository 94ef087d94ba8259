/**
 * EXPLAIN ANALYZE of the statements the screens and sync send, on a database of a realistic size:
 * EXPLAIN_POURS pours (default 20) of 300 tendons, each with a record pushed through the real push
 * operation (every 30th out of band, so there are flags and e-mails). The statements are the app's
 * own: captured from the server operations through Kysely's log, then explained with their
 * parameters (statements that write are planned, not run again). Prints each plan, and for each
 * scan of a whole table of over 1,000 rows says whether it fed a join (the planner's choice at this
 * size) or read the table to filter out 1,000 rows or more (a missing index), and counts joins that
 * compared 1,000 pairs of rows or more one by one (the figure, target 0).
 *   tsx --conditions=react-server --import ./scripts/bench/support/no-auth-options.mjs scripts/bench/explain.ts
 * (TEST_DATABASE_ADMIN_URL as for sync.ts)
 */
import { Kysely, PostgresDialect, sql, type CompiledQuery } from "kysely";
import pg from "pg";
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import type { Database } from "../../db/types";
import { dispatchOne } from "../../lib/server/dispatch-notifications";
import { findFlags } from "../../lib/server/find-flags";
import { getPourReport } from "../../lib/server/get-pour-report";
import { listTendonResults } from "../../lib/server/list-tendon-results";
import { listTendons } from "../../lib/server/list-tendons";
import { pullChanges } from "../../lib/server/pull-changes";
import { pushOps } from "../../lib/server/push-ops";
import { makeDatabase, report, seedBenchProject, toSyncOp } from "./harness";

const POURS = Number(process.env.EXPLAIN_POURS ?? 20);
const TENDONS = 300;

async function main() {
  const database = await makeDatabase("bench_explain");
  const db = createDb(database.url, 4);
  let captured: CompiledQuery[] = [];
  const logging = new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: database.url, max: 2 }) }),
    log: (event) => {
      if (event.level === "query") captured.push(event.query);
    },
  });
  const client = new pg.Client({ connectionString: database.url });
  try {
    await migrateToLatest(db);
    const bench = await seedBenchProject(db, {
      code: "EXP",
      pours: POURS,
      tendonsPerPour: TENDONS,
      outOfBandEvery: 30,
    });
    const user = await db
      .selectFrom("users")
      .select("id")
      .where("email", "=", bench.crewEmail)
      .executeTakeFirstOrThrow();
    const crew = {
      id: user.id,
      memberships: [{ projectId: bench.projectId, projectName: "Bench", projectCode: "EXP", role: "crew" as const }],
    };
    const started = performance.now();
    // Every pour but the last full; the last holds all its records but the first, which the push
    // explained below adds, so its read sees a pour of TENDONS - 1 records as a crew's last push would.
    const pushed = [...bench.opsByPour.slice(0, POURS - 1), bench.opsByPour[POURS - 1]!.slice(1)];
    for (const ops of pushed) {
      for (let i = 0; i < ops.length; i += 50)
        await pushOps(db, { user: crew, deviceId: "bench-explain-tablet", ops: ops.slice(i, i + 50).map(toSyncOp) });
    }
    console.log(
      `seeded ${POURS} pours × ${TENDONS} tendons, ${POURS * TENDONS - 1} records pushed in ${((performance.now() - started) / 1000).toFixed(0)} s`,
    );
    await sql`analyze`.execute(db);
    await client.connect();

    const pourId = bench.pourIds[0]!;
    const last = bench.opsByPour[POURS - 1]!;
    const reads: { name: string; run: () => Promise<unknown> }[] = [
      {
        name: "tendon list of a pour (listTendons)",
        run: () => listTendons(logging, { projectId: bench.projectId, pourId }),
      },
      {
        name: "tendon results of a pour (listTendonResults)",
        run: () => listTendonResults(logging, { projectId: bench.projectId, pourId }),
      },
      {
        name: "review queue (findFlags)",
        run: () => findFlags(logging, { projectIds: [bench.projectId], filter: { status: "any_open" } }),
      },
      {
        name: "pull of a pour from the start (pullChanges)",
        run: () => pullChanges(logging, { user: crew, cursor: "0", pourIds: [pourId] }),
      },
      {
        name: "pour report (getPourReport)",
        run: () => getPourReport(logging, { projectId: bench.projectId, pourId }),
      },
      {
        name: `push of one record into a pour of ${TENDONS - 1} records (pushOps)`,
        run: () => pushOps(logging, { user: crew, deviceId: "bench-explain-tablet", ops: [toSyncOp(last[0]!)] }),
      },
      { name: "e-mail dispatcher claim (dispatchOne)", run: () => dispatchOne(logging, async () => {}) },
    ];
    const big = new Map(
      (
        await sql<{
          relname: string;
          n: number;
        }>`select relname, n_live_tup::int as n from pg_stat_user_tables`.execute(db)
      ).rows.map((r) => [r.relname, r.n]),
    );
    let filteredScans = 0;
    for (const read of reads) {
      captured = [];
      await read.run();
      const statements = captured.filter((q) => /^\s*(select|with|insert|update)/i.test(q.sql));
      console.log(`\n### ${read.name}: ${statements.length} statement(s)`);
      for (const q of statements) {
        // Data-changing statements are explained inside a transaction that is rolled back.
        await client.query("begin");
        try {
          // A write that already happened (the push's claim) would be refused on a second run: plan only.
          const writes = /\b(insert|update|delete)\b/i.test(q.sql);
          const options = writes ? "costs off" : "analyze, costs off, timing off, summary on";
          const plan = await client.query<{ "QUERY PLAN": string }>(`explain (${options}) ${q.sql}`, [...q.parameters]);
          const lines = plan.rows.map((r) =>
            r["QUERY PLAN"].length > 160 ? `${r["QUERY PLAN"].slice(0, 160)} …` : r["QUERY PLAN"],
          );
          console.log("```");
          console.log(q.sql.length > 400 ? `${q.sql.slice(0, 400)} …` : q.sql);
          console.log("--");
          console.log(lines.join("\n"));
          console.log("```");
          lines.forEach((line, k) => {
            // A nested loop comparing every row with every other (a join without an index to use).
            const joined = Number(/Rows Removed by Join Filter: (\d+)/.exec(line)?.[1] ?? 0);
            if (joined >= 1000) {
              filteredScans++;
              console.log(`!! a join compared row by row: ${joined} pairs filtered out, in ${read.name}`);
            }
            const seq = /Seq Scan on (\w+)/.exec(line);
            if (!seq || (big.get(seq[1]!) ?? 0) <= 1000) return;
            const removed = Number(
              /Rows Removed by Filter: (\d+)/.exec(lines.slice(k + 1, k + 4).join("\n"))?.[1] ?? 0,
            );
            if (removed >= 1000) {
              filteredScans++;
              console.log(`!! ${seq[1]} read whole to keep a few: ${removed} rows filtered out, in ${read.name}`);
            } else {
              console.log(
                `-- ${seq[1]} (${big.get(seq[1]!)} rows) read whole into a join, in ${read.name}: the planner's choice at this size`,
              );
            }
          });
        } finally {
          await client.query("rollback");
        }
      }
    }
    report({
      figure: `hot statements reading a whole table or join to keep a few rows (${POURS * TENDONS - 1} records)`,
      value: String(filteredScans),
      target: "0",
      holds: filteredScans === 0,
    });
  } finally {
    await client.end().catch(() => {});
    await logging.destroy();
    await db.destroy();
    await database.drop();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
