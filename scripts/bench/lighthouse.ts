/**
 * Lighthouse (the npm package, its default mobile emulation: a mid-range phone, simulated slow 4G
 * and a 4× slower CPU) on the landing page, sign-in, the field log signed in as the demo crew and
 * the review queue signed in as the demo inspector, with Debian's Chromium. Prints performance,
 * accessibility and best-practices scores and LCP/TBT. Starts the app on BENCH_PORT (default 3390)
 * against DATABASE_URL, which must hold the demo seed (npm run bench seeds it).
 * Targets: performance ≥ 95, accessibility 100, best practices 100.
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import * as chromeLauncher from "chrome-launcher";
import lighthouse from "lighthouse";
import { report, signIn, startApp, waitForUrl } from "./harness";

const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;
const DEMO_PASSWORD = "tautline-demo";

const pages: { name: string; path: string; as?: string }[] = [
  { name: "landing", path: "/" },
  { name: "sign-in", path: "/sign-in" },
  { name: "field log", path: "/field", as: "crew@demo.tautline.test" },
  { name: "review queue", path: "/review", as: "inspector@demo.tautline.test" },
];

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
    const result = await lighthouse(`${BASE}${p.path}`, {
      port: Number(chrome.port),
      output: "json",
      logLevel: "error",
      onlyCategories: ["performance", "accessibility", "best-practices"],
      ...(cookie ? { extraHeaders: { Cookie: cookie } } : {}),
    });
    if (!result) throw new Error(`Lighthouse gave no result for ${p.path}`);
    const { categories, audits, finalDisplayedUrl } = result.lhr;
    const score = (id: string) => Math.round((categories[id]?.score ?? 0) * 100);
    const perf = score("performance");
    const a11y = score("accessibility");
    const bp = score("best-practices");
    const lcp = audits["largest-contentful-paint"]?.numericValue ?? Number.NaN;
    const tbt = audits["total-blocking-time"]?.numericValue ?? Number.NaN;
    if (new URL(finalDisplayedUrl).pathname !== p.path) console.log(`  note: ${p.path} ended on ${finalDisplayedUrl}`);
    const failing = (id: string) =>
      (categories[id]?.auditRefs ?? [])
        .filter((ref) => ref.weight > 0 && (audits[ref.id]?.score ?? 1) < 1)
        .map((ref) => ref.id);
    // What the figures come from: the element Lighthouse took as the largest paint, and the scripts
    // with the most main-thread time (its bootup-time audit). The whole report is kept beside the logs.
    const lcpItem = (
      audits["largest-contentful-paint-element"]?.details as
        { items?: { items?: { node?: { snippet?: string; nodeLabel?: string } }[] }[] } | undefined
    )?.items?.[0]?.items?.[0]?.node;
    if (lcpItem)
      console.log(`  ${p.name} largest paint: ${lcpItem.snippet ?? ""} "${(lcpItem.nodeLabel ?? "").slice(0, 60)}"`);
    const bootup = (
      (audits["bootup-time"]?.details as { items?: { url: string; scripting: number }[] } | undefined)?.items ?? []
    )
      .slice(0, 4)
      .map((i) => `${i.url.replace(BASE, "")} ${i.scripting.toFixed(0)} ms`);
    if (bootup.length) console.log(`  ${p.name} script time: ${bootup.join("; ")}`);
    if (process.env.BENCH_RESULTS)
      writeFileSync(
        path.join(path.dirname(process.env.BENCH_RESULTS), `lighthouse-${p.name.replace(/\W+/g, "-")}.json`),
        JSON.stringify(result.lhr),
      );
    if (a11y < 100)
      console.log(`  ${p.name} accessibility audits below full marks: ${failing("accessibility").join(", ")}`);
    if (bp < 100)
      console.log(`  ${p.name} best-practices audits below full marks: ${failing("best-practices").join(", ")}`);
    report({
      figure: `Lighthouse mobile, ${p.name} (${p.path}): perf / a11y / BP`,
      value: `${perf} / ${a11y} / ${bp}`,
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
