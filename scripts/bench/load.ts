/**
 * Many tablets at once. Phase 1: LOAD_TABLETS simulated tablets (default 50) each push
 * LOAD_RECORDS unique records (default 300) in batches of LOAD_BATCH (default 25), all at the same
 * time. Phase 2: as many new records again, every batch delivered twice at the same moment (a
 * retry racing its original). Prints throughput, p50/p95/p99 per batch and errors, then checks in
 * SQL that every op landed exactly once and every flag e-mail was queued once, waits for the
 * dispatcher(s) and checks the inbox got each e-mail once. Then a 500-tendon pour: the pull
 * (p95), and its report signed by the inspector, then the signed PDF downloaded.
 *
 * Alone it makes a database, starts the app (BENCH_PORT, default 3390) and one dispatcher.
 * `scripts/scale/run.sh` points it at a running stack instead: LOAD_BASE (the proxy),
 * LOAD_DATABASE_URL (the primary, for the seed and the checks) and MAIL_INBOX_URL.
 */
import { createHash } from "node:crypto";
import { sql } from "kysely";
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import { DEFAULT_POUR_STATEMENT } from "../../lib/schemas/report-signature";
import {
  assertLoopback,
  makeDatabase,
  percentile,
  pushOps,
  report,
  seedBenchProject,
  signIn,
  startApp,
  startDispatcher,
  tearDown,
  waitForUrl,
  type BenchOp,
} from "./harness";

const TABLETS = Number(process.env.LOAD_TABLETS ?? 50);
const RECORDS = Number(process.env.LOAD_RECORDS ?? 300);
const BATCH = Number(process.env.LOAD_BATCH ?? 25);
const BIG_POUR = 500;
const OUT_OF_BAND_EVERY = 30;
const PORT = Number(process.env.BENCH_PORT ?? 3390);
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:3391";
const LABEL = process.env.LOAD_LABEL ? ` (${process.env.LOAD_LABEL})` : "";
const PHASE_LIMIT_MS = 240_000;

interface Phase {
  batchMs: number[];
  errors: number;
  /** HTTP statuses of failed deliveries (0: no answer), with their counts. */
  failures: Map<number, number>;
  /** Ops sent at least once before the time limit (the rest were never sent). */
  delivered: BenchOp[];
  seconds: number;
  ops: number;
}

/** Every tablet pushes its ops batch after batch; with `twice`, each batch goes out twice at once. */
async function runPhase(
  base: string,
  cookie: string,
  tablets: BenchOp[][],
  tag: string,
  twice: boolean,
): Promise<Phase> {
  const batchMs: number[] = [];
  const failures = new Map<number, number>();
  const delivered: BenchOp[] = [];
  let errors = 0;
  const deadline = Date.now() + PHASE_LIMIT_MS;
  const started = performance.now();
  await Promise.all(
    tablets.map(async (ops, t) => {
      const deviceId = `bench-${tag}-tablet-${String(t).padStart(3, "0")}`;
      for (let i = 0; i < ops.length && Date.now() < deadline; i += BATCH) {
        const batch = ops.slice(i, i + BATCH);
        delivered.push(...batch);
        const deliveries = await Promise.all(
          (twice ? [1, 2] : [1]).map(() =>
            pushOps(base, cookie, deviceId, batch).catch(() => ({
              status: 0,
              statuses: [] as string[],
              ms: Number.NaN,
            })),
          ),
        );
        for (const d of deliveries) {
          if (Number.isFinite(d.ms)) batchMs.push(d.ms);
          if (d.status !== 200) {
            errors += batch.length;
            failures.set(d.status, (failures.get(d.status) ?? 0) + 1);
          }
        }
        // Each op must be applied by exactly one delivery; any other delivery answers duplicate.
        batch.forEach((_, k) => {
          const got = deliveries.map((d) => d.statuses[k]).filter(Boolean);
          const applied = got.filter((s) => s === "applied").length;
          const duplicate = got.filter((s) => s === "duplicate").length;
          if (got.length === deliveries.length && (applied !== 1 || applied + duplicate !== got.length)) errors++;
        });
      }
    }),
  );
  const seconds = (performance.now() - started) / 1000;
  if (Date.now() >= deadline) errors++;
  return { batchMs, errors, failures, delivered, seconds, ops: tablets.reduce((n, ops) => n + ops.length, 0) };
}

function reportPhase(name: string, p: Phase): void {
  report({
    figure: `load${LABEL}: ${name}, drained in`,
    value: `${p.seconds.toFixed(1)} s`,
    target: "≤ 60 s",
    holds: p.seconds <= 60,
  });
  report({
    figure: `load${LABEL}: ${name}, throughput`,
    value: `${(p.ops / p.seconds).toFixed(0)} records/s`,
    target: "",
    holds: null,
  });
  report({
    figure: `load${LABEL}: ${name}, per batch p50 / p95 / p99`,
    value: `${percentile(p.batchMs, 50).toFixed(0)} / ${percentile(p.batchMs, 95).toFixed(0)} / ${percentile(p.batchMs, 99).toFixed(0)} ms`,
    target: "p95 < 1000 ms",
    holds: percentile(p.batchMs, 95) < 1000,
  });
  const statuses = [...p.failures].map(([status, n]) => `${n} × HTTP ${status || "no answer"}`).join(", ");
  report({
    figure: `load${LABEL}: ${name}, errors (ops)`,
    value: `${p.errors}${statuses ? ` (${statuses})` : ""}`,
    target: "0",
    holds: p.errors === 0,
  });
}

async function main() {
  const external = process.env.LOAD_BASE;
  const base = external ?? `http://localhost:${PORT}`;
  assertLoopback(base);
  assertLoopback(INBOX);
  const database = process.env.LOAD_DATABASE_URL
    ? { url: process.env.LOAD_DATABASE_URL, drop: async () => {} }
    : await makeDatabase("bench_load");
  const db = createDb(database.url, 4);
  const stops: (() => Promise<void>)[] = [];
  try {
    await migrateToLatest(db);
    const code = `L${Date.now().toString(36).slice(-5).toUpperCase()}`;
    const load = await seedBenchProject(db, {
      code,
      pours: TABLETS * 2 + 1,
      tendonsPerPour: RECORDS,
      outOfBandEvery: OUT_OF_BAND_EVERY,
    });
    const big = await seedBenchProject(db, {
      code: `${code}B`,
      pours: 1,
      tendonsPerPour: BIG_POUR,
      outOfBandEvery: 50,
    });
    if (!external) {
      stops.push(startApp(PORT, { DATABASE_URL: database.url }));
      stops.push(startDispatcher({ DATABASE_URL: database.url }));
      await waitForUrl(`${base}/api/health`);
    }
    await fetch(`${INBOX}/api/messages`, { method: "DELETE" });
    const cookie = await signIn(base, load.crewEmail, load.password);
    // Warm-up, not timed: one pour pushed once, so the first timed batches do not pay for the
    // server's first compile of the route and its pool's connections.
    const warm = load.opsByPour[TABLETS * 2]!;
    await runPhase(base, cookie, [warm.slice(0, 4 * BATCH)], "warm", false);
    console.log(
      `load${LABEL}: ${TABLETS} tablets × ${RECORDS} records in batches of ${BATCH} through ${base}/api/sync/push`,
    );

    const first = await runPhase(base, cookie, load.opsByPour.slice(0, TABLETS), "a", false);
    reportPhase("unique batches", first);
    const second = await runPhase(base, cookie, load.opsByPour.slice(TABLETS, TABLETS * 2), "b", true);
    reportPhase("every batch delivered twice", second);

    // Exactly once, in SQL.
    const warmed = Math.min(warm.length, 4 * BATCH);
    const sent = [...first.delivered, ...second.delivered, ...warm.slice(0, warmed)];
    const unsent = TABLETS * 2 * RECORDS + warmed - sent.length;
    if (unsent > 0)
      report({
        figure: `load${LABEL}: ops never sent (time limit ${PHASE_LIMIT_MS / 1000} s a phase)`,
        value: String(unsent),
        target: "0",
        holds: false,
      });
    // Every op sent lands exactly once; an op never sent must not be there.
    const expectedOps = sent.length;
    const expectedMail = sent.filter((o) => o.outOfBand).length;
    const check = await sql<{
      records: number;
      tendons_twice: number;
      claims: number;
      mails: number;
      mail_keys: number;
    }>`
      select
        (select count(*) from records where project_id = ${load.projectId}) as records,
        (select count(*) from (select tendon_id from records where project_id = ${load.projectId} group by tendon_id having count(*) > 1) t) as tendons_twice,
        (select count(*) from applied_ops where project_id = ${load.projectId} and status = 'applied') as claims,
        (select count(*) from notifications where project_id = ${load.projectId}) as mails,
        (select count(distinct dedupe_key) from notifications where project_id = ${load.projectId}) as mail_keys
    `.execute(db);
    const c = check.rows[0]!;
    const once = c.records === expectedOps && c.tendons_twice === 0 && c.claims === expectedOps;
    report({
      figure: `load${LABEL}: ops landed exactly once (SQL)`,
      value: `${c.records} records, ${c.claims} claims, ${c.tendons_twice} tendons twice, of ${expectedOps} ops sent`,
      target: "each once",
      holds: once,
    });
    report({
      figure: `load${LABEL}: flag e-mails queued once (SQL)`,
      value: `${c.mails} queued, ${c.mail_keys} distinct, of ${expectedMail} out-of-band records`,
      target: "each once",
      holds: c.mails === expectedMail && c.mail_keys === expectedMail,
    });

    // What a stored record costs on disk, everything it brings included (claim, evaluation, flags,
    // e-mail, audit, indexes), for sizing: the whole database over the records in it.
    const size = await sql<{ bytes: number; records: number }>`
      select pg_database_size(current_database())::bigint as bytes, (select count(*) from records) as records`.execute(
      db,
    );
    const { bytes, records } = size.rows[0]!;
    report({
      figure: `load${LABEL}: database size per stored record`,
      value: `${(bytes / records / 1024).toFixed(1)} KB (${(bytes / 1024 ** 2).toFixed(0)} MB for ${records} records)`,
      target: "",
      holds: null,
    });

    // Every e-mail sent once: wait for the dispatcher(s), bounded.
    const mailStart = performance.now();
    let pending = Number.POSITIVE_INFINITY;
    for (let i = 0; i < 600 && pending > 0; i++) {
      pending = (
        await sql<{
          n: number;
        }>`select count(*) as n from notifications where project_id = ${load.projectId} and status <> 'sent'`.execute(
          db,
        )
      ).rows[0]!.n;
      if (pending > 0) await new Promise((r) => setTimeout(r, 500));
    }
    const mailSeconds = (performance.now() - mailStart) / 1000;
    const inbox = (await (
      await fetch(`${INBOX}/api/messages?to=${encodeURIComponent(load.engineerEmail)}`)
    ).json()) as { text: string }[];
    const distinct = new Set(inbox.map((m) => m.text)).size;
    report({
      figure: `load${LABEL}: flag e-mails in the inbox`,
      value: `${inbox.length} received, ${distinct} distinct, of ${expectedMail} (outbox drained ${mailSeconds.toFixed(1)} s after the load)`,
      target: "each once",
      holds: inbox.length === expectedMail && distinct === expectedMail,
    });

    // A 500-tendon pour: stored, then pulled and reported.
    const bigCookie = await signIn(base, big.crewEmail, big.password);
    const bigOps = big.opsByPour[0]!;
    for (let i = 0; i < bigOps.length; i += 50) {
      const r = await pushOps(base, bigCookie, "bench-big-pour-tablet", bigOps.slice(i, i + 50));
      if (r.status !== 200) throw new Error(`the 500-tendon pour's push answered ${r.status}`);
    }
    const pullMs: number[] = [];
    let pulledBytes = 0;
    for (let i = 0; i < 30; i++) {
      const started = performance.now();
      const res = await fetch(`${base}/api/sync/pull?cursor=0&pours=${big.pourIds[0]}`, {
        headers: { cookie: bigCookie },
        signal: AbortSignal.timeout(30_000),
      });
      const body = await res.arrayBuffer();
      if (res.status !== 200) throw new Error(`pull answered ${res.status}`);
      if (i > 0) pullMs.push(performance.now() - started);
      pulledBytes = body.byteLength;
    }
    report({
      figure: `pull of a 500-tendon pour${LABEL}, p50 / p95 of 29`,
      value: `${percentile(pullMs, 50).toFixed(0)} / ${percentile(pullMs, 95).toFixed(0)} ms (${(pulledBytes / 1024).toFixed(0)} KB)`,
      target: "p95 < 300 ms",
      holds: percentile(pullMs, 95) < 300,
    });
    // The report signed first, as the app does it: the inspector (report.sign) signs through the
    // signing route, which draws the PDF unsigned (for the content hash) and again with the
    // signature block, and stores that file; the timed download is that signed file.
    const inspectorCookie = await signIn(base, big.inspectorEmail, big.password);
    const reportApi = `${base}/api/projects/${big.projectId}/pours/${big.pourIds[0]}/report`;
    const signStarted = performance.now();
    const signing = await fetch(`${reportApi}/signatures`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: base, cookie: inspectorCookie },
      body: JSON.stringify({
        signerName: "Bench inspector",
        licence: "Bench special inspector 0001",
        statement: DEFAULT_POUR_STATEMENT,
      }),
      signal: AbortSignal.timeout(120_000),
    });
    const signMs = performance.now() - signStarted;
    if (signing.status !== 201)
      throw new Error(`signing the report answered ${signing.status}: ${await signing.text()}`);
    const signed = (await signing.json()) as { revision: number; fileSha256: string };
    report({
      figure: `signing the report of a 500-tendon pour${LABEL} (inspector, signing route: PDF drawn unsigned and signed, stored)`,
      value: `${(signMs / 1000).toFixed(2)} s`,
      target: "< 3 s",
      holds: signMs < 3000,
    });
    const pdfMs: number[] = [];
    let pdfBytes = 0;
    for (let i = 0; i < 4; i++) {
      const started = performance.now();
      const res = await fetch(`${reportApi}/signatures/${signed.revision}`, {
        headers: { cookie: inspectorCookie },
        signal: AbortSignal.timeout(60_000),
      });
      const body = await res.arrayBuffer();
      if (res.status !== 200) throw new Error(`the signed PDF report answered ${res.status}`);
      if (i > 0) pdfMs.push(performance.now() - started);
      pdfBytes = body.byteLength;
      if (createHash("sha256").update(Buffer.from(body)).digest("hex") !== signed.fileSha256)
        throw new Error("the signed PDF downloaded is not the file that was signed");
    }
    report({
      figure: `signed PDF report of a 500-tendon pour${LABEL} (with its signature block), download slowest of 3`,
      value: `${(Math.max(...pdfMs) / 1000).toFixed(2)} s (${(pdfBytes / 1024).toFixed(0)} KB)`,
      target: "< 3 s",
      holds: Math.max(...pdfMs) < 3000,
    });
  } finally {
    await tearDown(stops, db, database);
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
