/**
 * Checks the page-weight figure against what Chromium really downloads: loads one route of the
 * production build with a cold cache, sums the compressed bytes of every script response until
 * the page is idle, and sets that beside the build-manifest figure of scripts/bench/page-weight.ts.
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
    await page.goto(`${BASE}${ROUTE}`, { waitUntil: "load" });
    await page.waitForLoadState("networkidle");
    await page.waitForTimeout(500);
    const browserKb = scripts.reduce((n, s) => n + s.bytes, 0) / 1024;
    const manifest = routeChunks().find((r) => r.route === ROUTE);
    if (!manifest) throw new Error(`no build manifest for ${ROUTE}`);
    const manifestKb = manifest.files.reduce((n, f) => n + gzipBytes(f), 0) / 1024;
    const loaded = new Set(scripts.map((s) => new URL(s.url).pathname.replace(/^\/_next\//, "")));
    const missing = manifest.files.filter((f) => !loaded.has(f));
    const extra = [...loaded].filter((f) => !manifest.files.includes(f));
    console.log(
      `${ROUTE}: ${scripts.length} scripts, ${browserKb.toFixed(1)} KB over the wire (gzip); build manifest ${manifestKb.toFixed(1)} KB in ${manifest.files.length} files`,
    );
    if (missing.length) console.log(`  in the manifest, not loaded: ${missing.join(", ")}`);
    if (extra.length) console.log(`  loaded, not in the manifest: ${extra.join(", ")}`);
    const agree = Math.abs(browserKb - manifestKb) / manifestKb <= 0.05;
    report({
      figure: `first-load JS ${ROUTE}, Chromium's network log vs the build's lists`,
      value: `${browserKb.toFixed(0)} KB vs ${manifestKb.toFixed(0)} KB`,
      target: "within 5 %",
      holds: agree,
    });
  } finally {
    await browser.close();
  }
} finally {
  await stop();
}
