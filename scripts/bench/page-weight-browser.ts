/**
 * Checks the page-weight figure against what Chromium really downloads: loads one route of the
 * production build with a cold cache, sums the compressed bytes of every script response until
 * the page is idle, and sets the scripts the build lists for the route's first load beside the
 * build-manifest figure of scripts/bench/page-weight.ts. The scripts loaded on demand after that
 * (the field screens and the tablet's database code, `next/dynamic` and `import()`) are printed as
 * a figure of their own: first load plus those is what the browser fetched before the page settled.
 * Starts the app on BENCH_PORT (default 3390) against DATABASE_URL.
 *
 *   tsx scripts/bench/page-weight-browser.ts [/field/pour]
 */
import { chromium } from "@playwright/test";
import { gzipBytes, routeChunks } from "./page-weight";
import { report, startApp, waitForUrl } from "./harness";

const ROUTE = process.argv[2] ?? "/field/pour";
const PORT = Number(process.env.BENCH_PORT ?? 3390);
const BASE = `http://localhost:${PORT}`;

const stop = startApp(PORT, {});
try {
  await waitForUrl(`${BASE}/api/health`);
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium" });
  try {
    const context = await browser.newContext({ serviceWorkers: "block" });
    const page = await context.newPage();
    const scripts: { url: string; bytes: number }[] = [];
    page.on("requestfinished", async (request) => {
      if (request.resourceType() !== "script") return;
      const sizes = await request.sizes();
      scripts.push({ url: request.url(), bytes: sizes.responseBodySize });
    });
    const inFlight = new Set<string>();
    const others = new Map<string, number>();
    page.on("request", (r) => {
      inFlight.add(r.url());
      if (r.resourceType() !== "script") {
        const key = `${r.method()} ${r.url().replace(BASE, "")}`;
        others.set(key, (others.get(key) ?? 0) + 1);
      }
    });
    page.on("requestfinished", (r) => inFlight.delete(r.url()));
    page.on("requestfailed", (r) => inFlight.delete(r.url()));
    await page.goto(`${BASE}${ROUTE}`, { waitUntil: "load" });
    // Settled: no script requested for 2 s (the page's own calls to the server may go on).
    let quietSince = Date.now();
    let seen = 0;
    for (const until = Date.now() + 30_000; Date.now() < until && Date.now() - quietSince < 2000;) {
      await page.waitForTimeout(100);
      const now = scripts.length + [...inFlight].filter((u) => u.endsWith(".js")).length;
      if (now !== seen) [seen, quietSince] = [now, Date.now()];
    }
    console.log(`  other requests: ${[...others].map(([k, n]) => `${k} ×${n}`).join(", ")}`);
    if (Date.now() - quietSince < 2000) console.log(`  still loading after 30 s: ${[...inFlight].join(", ")}`);
    const manifest = routeChunks().find((r) => r.route === ROUTE);
    if (!manifest) throw new Error(`no build manifest for ${ROUTE}`);
    const manifestKb = manifest.files.reduce((n, f) => n + gzipBytes(f), 0) / 1024;
    const fileOf = (url: string) => new URL(url).pathname.replace(/^\/_next\//, "");
    const first = scripts.filter((s) => manifest.files.includes(fileOf(s.url)));
    const later = scripts.filter((s) => !manifest.files.includes(fileOf(s.url)));
    const kb = (list: typeof scripts) => list.reduce((n, s) => n + s.bytes, 0) / 1024;
    const firstKb = kb(first);
    const laterKb = kb(later);
    const missing = manifest.files.filter((f) => !first.some((s) => fileOf(s.url) === f));
    console.log(
      `${ROUTE}: ${scripts.length} scripts, ${(firstKb + laterKb).toFixed(1)} KB over the wire (gzip): ${firstKb.toFixed(1)} KB in the ${first.length} files the build lists for the first load (manifest ${manifestKb.toFixed(1)} KB in ${manifest.files.length} files), ${laterKb.toFixed(1)} KB in ${later.length} loaded on demand`,
    );
    if (missing.length) console.log(`  in the manifest, not loaded: ${missing.join(", ")}`);
    for (const s of later) console.log(`  on demand: ${fileOf(s.url)} ${(s.bytes / 1024).toFixed(1)} KB`);
    report({
      figure: `first-load JS ${ROUTE}, Chromium's network log vs the build's lists`,
      value: `${firstKb.toFixed(0)} KB vs ${manifestKb.toFixed(0)} KB`,
      target: "within 5 %",
      holds: missing.length === 0 && Math.abs(firstKb - manifestKb) / manifestKb <= 0.05,
    });
    report({
      figure: `JS ${ROUTE} until the page settles (first load + loaded on demand), cold cache`,
      value: `${(firstKb + laterKb).toFixed(0)} KB (${firstKb.toFixed(0)} + ${laterKb.toFixed(0)}) gzip`,
      target: "–",
      holds: null,
    });
  } finally {
    await browser.close();
  }
} finally {
  await stop();
}
