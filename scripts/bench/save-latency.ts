/**
 * The wait a crew's flag really takes: "Save record" pressed on the tablet, with signal, in
 * Chromium → the sync client sends it at once → stored and judged on the server → the flag e-mail
 * in the local inbox. BENCH_SAVES (default 100) out-of-band records are typed into the field log
 * one after the other, as a crew would (tag, set, final pressure, marks, Save); the inbox is polled
 * every 100 ms; prints p50/p95 from the press of Save to the e-mail. The dispatcher runs at its
 * default interval (3 s). Starts the app (BENCH_PORT, default 3390) and a dispatcher on a database
 * of its own, with an invented bench project (scripts/bench/harness.ts).
 */
import { chromium, type Page } from "@playwright/test";
import { createDb } from "../../db/connect";
import { migrateToLatest } from "../../db/migrate";
import {
  assertLoopback,
  contextWithSession,
  makeDatabase,
  noteArrivals,
  percentile,
  report,
  seedBenchProject,
  signIn,
  startApp,
  startDispatcher,
  tearDown,
  waitForUrl,
} from "./harness";

const SAVES = Number(process.env.BENCH_SAVES ?? 100);
const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:3391";
const LIMIT_MS = 60_000; // after the last save, for the last e-mails

/** Types one record as the crew does and presses Save; answers when Save was pressed. */
async function saveRecord(page: Page, tag: string, entered: { finalPressure: string; after: string }) {
  await page.getByLabel("Find a tendon by tag").fill(tag);
  await page.getByTestId("tendon-row").filter({ hasText: tag }).click();
  await page.getByTestId("selected-tag").filter({ hasText: tag }).waitFor();
  await page.getByRole("radio", { name: /Bench set/ }).check();
  // The bench project reads ram travel by default; these readings are marks (the chip is the label).
  await page.getByText("Marks", { exact: true }).click();
  await page.getByLabel(/Final gauge pressure/).fill(entered.finalPressure);
  await page.getByLabel(/Mark before/).fill("0");
  await page.getByLabel(/Mark after/).fill(entered.after);
  const goAhead = page.getByLabel(/Who confirmed the concrete on site/);
  if (await goAhead.isVisible()) await goAhead.fill("Bench: cylinders read on site (invented).");
  const pressed = performance.now();
  await page.getByRole("button", { name: "Save record" }).click();
  await page.getByTestId("verdict").locator("[data-verdict]").first().waitFor();
  return pressed;
}

async function main() {
  assertLoopback(INBOX);
  const database = await makeDatabase("bench_save_latency");
  const db = createDb(database.url, 2);
  const stops: (() => Promise<void>)[] = [];
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium" });
  try {
    await migrateToLatest(db);
    const bench = await seedBenchProject(db, { code: "SAV", pours: 1, tendonsPerPour: SAVES, outOfBandEvery: 1 });
    const tendons = await db
      .selectFrom("tendons")
      .select(["id", "tag"])
      .where("project_id", "=", bench.projectId)
      .orderBy("tag")
      .execute();
    // The same readings the bench's own ops carry: the calibrated pressure and a mark 15 % long.
    const readings = new Map(
      bench.opsByPour[0]!.map((op) => {
        const entered = op.payload.entered as { finalPressure: string; marks: { after: string } };
        return [op.payload.tendonId, { finalPressure: entered.finalPressure, after: entered.marks.after }];
      }),
    );
    stops.push(startApp(PORT, { DATABASE_URL: database.url }));
    stops.push(
      startDispatcher({ DATABASE_URL: database.url, DISPATCH_INTERVAL_MS: process.env.DISPATCH_INTERVAL_MS ?? "3000" }),
    );
    await waitForUrl(`${BASE}/api/health`);
    const cookie = await signIn(BASE, bench.crewEmail, bench.password);
    await fetch(`${INBOX}/api/messages`, { method: "DELETE" });

    const context = await contextWithSession(browser, BASE, cookie);
    const page = await context.newPage();
    await page.goto(`${BASE}/field`);
    await page.getByTestId("available-pour").filter({ hasText: "Bench pour 1" }).getByRole("button").click();
    const ready = page.getByTestId("ready-pour").filter({ hasText: "Bench pour 1" });
    await ready.getByTestId("ready-offline").waitFor({ timeout: 60_000 });
    await ready.getByRole("link", { name: "Open tendon list" }).click();
    await page.getByTestId("tendon-row").first().waitFor({ timeout: 30_000 });

    const savedAt = new Map<string, number>();
    const arrivedAt = new Map<string, number>();
    const poll = () => noteArrivals(INBOX, bench.engineerEmail, /P1-\d{4}/, arrivedAt);
    let polling = true;
    const poller = (async () => {
      while (polling) {
        await poll().catch(() => undefined);
        await new Promise((r) => setTimeout(r, 100));
      }
    })();
    let errors = 0;
    for (const t of tendons) {
      try {
        savedAt.set(t.tag, await saveRecord(page, t.tag, readings.get(t.id)!));
      } catch (error) {
        // The screen as it stood, kept beside the logs, for the first failure.
        if (!errors++) await page.screenshot({ path: ".tmp/bench/save-latency-failed.png" }).catch(() => undefined);
        console.error(`  ${t.tag}: ${(error as Error).message.split("\n")[0]}`);
      }
    }
    const deadline = Date.now() + LIMIT_MS;
    while (arrivedAt.size < savedAt.size && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
    polling = false;
    await poller;
    const waits = [...arrivedAt]
      .filter(([tag]) => savedAt.has(tag))
      .map(([tag, at]) => (at - savedAt.get(tag)!) / 1000);
    report({
      figure: `flag e-mail after "Save record" on the tablet with signal, p50 / p95 of ${SAVES} (Chromium, dispatcher every ${Number(process.env.DISPATCH_INTERVAL_MS ?? 3000) / 1000} s, SMTP)`,
      value: `${percentile(waits, 50).toFixed(1)} / ${percentile(waits, 95).toFixed(1)} s; ${waits.length} of ${SAVES} arrived, ${errors} saves failed`,
      target: "p95 < 10 s",
      holds: waits.length === SAVES && errors === 0 && percentile(waits, 95) < 10,
    });
  } finally {
    await browser.close();
    await tearDown(stops, db, database);
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
