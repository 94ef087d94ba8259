/**
 * Lighthouse (the npm package, its default mobile emulation: a mid-range phone, simulated slow 4G
 * and a 4× slower CPU) on the landing page, sign-in, the field log signed in as the demo crew and
 * the review queue signed in as the demo inspector, with Debian's Chromium. Prints performance,
 * accessibility and best-practices scores and LCP/TBT. Starts the app on BENCH_PORT (default 3390)
 * against DATABASE_URL, which must hold the demo seed (npm run bench seeds it).
 * Targets: performance ≥ 95, accessibility 100, best practices 100.
 *
 * Each page is measured LIGHTHOUSE_RUNS times (default 3) and the run with the median performance
 * score is reported: the simulated CPU time, and with it TBT and the score, moves with what else the
 * machine runs. Beside the scores it prints what does not depend on that load, for the median run:
 * the bytes of JavaScript and CSS the page loads, the render-blocking requests, the largest paint's
 * element and phases, the main-thread time by kind and by script, and the unused JavaScript.
 * LIGHTHOUSE_PAGES="landing sign-in" measures some pages only (names as in `pages` below).
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import * as chromeLauncher from "chrome-launcher";
import lighthouse from "lighthouse";
import { report, signIn, startApp, waitForUrl } from "./harness";

const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;
const DEMO_PASSWORD = "tautline-demo";
const RUNS = Math.max(1, Number(process.env.LIGHTHOUSE_RUNS ?? 3));

const allPages: { name: string; path: string; as?: string }[] = [
  { name: "landing", path: "/" },
  { name: "sign-in", path: "/sign-in" },
  { name: "field log", path: "/field", as: "crew@demo.tautline.test" },
  { name: "review queue", path: "/review", as: "inspector@demo.tautline.test" },
];
const only = (process.env.LIGHTHOUSE_PAGES ?? "").split(/\s+/).filter(Boolean);
const pages = only.length ? allPages.filter((p) => only.includes(p.name.replace(/\W+/g, "-"))) : allPages;

type Lhr = NonNullable<Awaited<ReturnType<typeof lighthouse>>>["lhr"];
type Items<T> = { items?: T[] } | undefined;

const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} KB`;
const ms = (n: number | undefined) => `${(n ?? Number.NaN).toFixed(0)} ms`;
const short = (url: string) => url.replace(BASE, "").replace(/^\/_next\/static\//, "");

function itemsOf<T>(lhr: Lhr, id: string): T[] {
  return (lhr.audits[id]?.details as Items<T>)?.items ?? [];
}

/** What the median run's report says about where the time and the bytes go (load-independent parts first). */
function explain(name: string, lhr: Lhr): void {
  const { audits } = lhr;
  const line = (what: string, text: string) => console.log(`  ${name} ${what}: ${text}`);
  const requests = itemsOf<{ url: string; resourceType?: string; transferSize?: number }>(lhr, "network-requests");
  const bytesOf = (type: string) =>
    requests.filter((r) => r.resourceType === type).reduce((n, r) => n + (r.transferSize ?? 0), 0);
  const count = (type: string) => requests.filter((r) => r.resourceType === type).length;
  line(
    "bytes",
    `document ${kb(bytesOf("Document"))}; JS ${kb(bytesOf("Script"))} in ${count("Script")} files; ` +
      `CSS ${kb(bytesOf("Stylesheet"))} in ${count("Stylesheet")}; fonts ${kb(bytesOf("Font"))} in ${count("Font")}`,
  );
  const blocking = itemsOf<{ url: string; totalBytes?: number; wastedMs?: number }>(lhr, "render-blocking-resources");
  line(
    "render-blocking",
    blocking.length
      ? blocking.map((b) => `${short(b.url)} ${kb(b.totalBytes ?? 0)} (${ms(b.wastedMs)})`).join("; ")
      : "none",
  );
  const lcpLists = (audits["largest-contentful-paint-element"]?.details as Items<{ items?: unknown[] }>)?.items ?? [];
  const node = (lcpLists[0]?.items?.[0] as { node?: { snippet?: string; nodeLabel?: string } } | undefined)?.node;
  if (node) line("largest paint", `${node.snippet ?? ""} "${(node.nodeLabel ?? "").slice(0, 60)}"`);
  const phases = (lcpLists[1]?.items ?? []) as { phase: string; timing: number }[];
  if (phases.length) line("largest paint phases", phases.map((p) => `${p.phase} ${ms(p.timing)}`).join(", "));
  const metrics = itemsOf<Record<string, number>>(lhr, "metrics")[0];
  if (metrics)
    line(
      "observed in the browser (unthrottled)",
      `FCP ${ms(metrics.observedFirstContentfulPaint)}, LCP ${ms(metrics.observedLargestContentfulPaint)}, ` +
        `load ${ms(metrics.observedLoad)}; simulated FCP ${ms(metrics.firstContentfulPaint)}, ` +
        `speed index ${ms(metrics.speedIndex)}, CLS ${(metrics.cumulativeLayoutShift ?? 0).toFixed(3)}`,
    );
  const work = itemsOf<{ groupLabel: string; duration: number }>(lhr, "mainthread-work-breakdown");
  line(
    "main-thread work (×4 CPU)",
    `${ms(work.reduce((n, w) => n + w.duration, 0))}: ` +
      work
        .slice(0, 5)
        .map((w) => `${w.groupLabel} ${ms(w.duration)}`)
        .join(", "),
  );
  const bootup = itemsOf<{ url: string; scripting: number; scriptParseCompile: number }>(lhr, "bootup-time");
  if (bootup.length)
    line(
      "script time (run + compile)",
      bootup
        .slice(0, 5)
        .map((i) => `${short(i.url)} ${ms(i.scripting)} + ${ms(i.scriptParseCompile)}`)
        .join("; "),
    );
  const longTasks = itemsOf<{ url: string; duration: number }>(lhr, "long-tasks");
  line(
    "long tasks (simulated)",
    longTasks.length ? longTasks.map((t) => `${short(t.url)} ${ms(t.duration)}`).join("; ") : "none",
  );
  const unused = itemsOf<{ url: string; wastedBytes: number; totalBytes: number }>(lhr, "unused-javascript");
  if (unused.length)
    line(
      "unused JavaScript",
      unused.map((u) => `${short(u.url)} ${kb(u.wastedBytes)} of ${kb(u.totalBytes)}`).join("; "),
    );
  const benchmarkIndex = lhr.environment?.benchmarkIndex;
  if (benchmarkIndex) line("machine", `Lighthouse's CPU benchmark index ${benchmarkIndex.toFixed(0)}`);
}

const stop = startApp(PORT, {});
const chrome = await chromeLauncher.launch({
  chromePath: "/usr/bin/chromium",
  chromeFlags: ["--headless=new", "--no-sandbox", "--disable-gpu"],
});
try {
  await waitForUrl(`${BASE}/api/health`);
  for (const p of pages) {
    const cookie = p.as ? await signIn(BASE, p.as, DEMO_PASSWORD) : undefined;
    // One warm-up load so the server's first compile of the route is not what is measured.
    await fetch(`${BASE}${p.path}`, { headers: cookie ? { cookie } : {} });
    const runs: Lhr[] = [];
    for (let i = 0; i < RUNS; i++) {
      const result = await lighthouse(`${BASE}${p.path}`, {
        port: Number(chrome.port),
        output: "json",
        logLevel: "error",
        onlyCategories: ["performance", "accessibility", "best-practices"],
        ...(cookie ? { extraHeaders: { Cookie: cookie } } : {}),
      });
      if (!result) throw new Error(`Lighthouse gave no result for ${p.path}`);
      const lhr = result.lhr;
      const perfOf = Math.round((lhr.categories.performance?.score ?? 0) * 100);
      const observed = itemsOf<Record<string, number>>(lhr, "metrics")[0];
      console.log(
        `  ${p.name} run ${i + 1}/${RUNS}: perf ${perfOf}, LCP ${ms(lhr.audits["largest-contentful-paint"]?.numericValue)}, ` +
          `TBT ${ms(lhr.audits["total-blocking-time"]?.numericValue)}, FCP ${ms(lhr.audits["first-contentful-paint"]?.numericValue)}` +
          ` (first paint seen at ${ms(observed?.observedFirstPaint)}, load at ${ms(observed?.observedLoad)})`,
      );
      runs.push(lhr);
    }
    const byPerf = [...runs].sort(
      (a, b) => (a.categories.performance?.score ?? 0) - (b.categories.performance?.score ?? 0),
    );
    const lhr = byPerf[Math.floor((byPerf.length - 1) / 2)]!;
    const { categories, audits, finalDisplayedUrl } = lhr;
    const score = (id: string) => Math.round((categories[id]?.score ?? 0) * 100);
    const perf = score("performance");
    const a11y = Math.min(...runs.map((r) => Math.round((r.categories.accessibility?.score ?? 0) * 100)));
    const bp = Math.min(...runs.map((r) => Math.round((r.categories["best-practices"]?.score ?? 0) * 100)));
    const lcp = audits["largest-contentful-paint"]?.numericValue ?? Number.NaN;
    const tbt = audits["total-blocking-time"]?.numericValue ?? Number.NaN;
    if (new URL(finalDisplayedUrl).pathname !== p.path) console.log(`  note: ${p.path} ended on ${finalDisplayedUrl}`);
    const failing = (id: string) => [
      ...new Set(
        runs.flatMap((r) =>
          (r.categories[id]?.auditRefs ?? [])
            .filter((ref) => ref.weight > 0 && (r.audits[ref.id]?.score ?? 1) < 1)
            .map((ref) => ref.id),
        ),
      ),
    ];
    explain(p.name, lhr);
    // The median run's whole report is kept beside the logs.
    if (process.env.BENCH_RESULTS)
      writeFileSync(
        path.join(path.dirname(process.env.BENCH_RESULTS), `lighthouse-${p.name.replace(/\W+/g, "-")}.json`),
        JSON.stringify(lhr),
      );
    if (a11y < 100)
      console.log(`  ${p.name} accessibility audits below full marks: ${failing("accessibility").join(", ")}`);
    if (bp < 100)
      console.log(`  ${p.name} best-practices audits below full marks: ${failing("best-practices").join(", ")}`);
    const perfs = runs.map((r) => Math.round((r.categories.performance?.score ?? 0) * 100));
    report({
      figure: `Lighthouse mobile, ${p.name} (${p.path}): perf / a11y / BP, median of ${RUNS}`,
      value: `${perf} / ${a11y} / ${bp}${RUNS > 1 ? ` (perf ${Math.min(...perfs)}–${Math.max(...perfs)})` : ""}`,
      target: "≥ 95 / 100 / 100",
      holds: perf >= 95 && a11y === 100 && bp === 100,
    });
    report({
      figure: `Lighthouse mobile, ${p.name}: LCP / TBT`,
      value: `${(lcp / 1000).toFixed(2)} s / ${tbt.toFixed(0)} ms`,
      target: "",
      holds: null,
    });
  }
} finally {
  chrome.kill();
  await stop();
}
