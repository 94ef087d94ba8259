/**
 * First-load JavaScript per route, gzip, from the production build's own lists: for each route,
 * `.next/server/app/<route>/page_client-reference-manifest.js` names the client chunks of the page
 * and its layouts (`entryJSFiles`), and `.next/build-manifest.json` the runtime every page loads
 * (`rootMainFiles`, `polyfillFiles` are nomodule and skipped by modern browsers). Each file is
 * gzipped here (zlib level 6, as `next start` compresses). `scripts/bench/page-weight-browser.ts`
 * checks the figure for one route against what Chromium actually downloads.
 * Targets: field-log routes (the tablet: /field…, /offline, /sign-in) ≤ 170 KB, office screens ≤ 230 KB.
 *
 *   npm run build && tsx scripts/bench/page-weight.ts [--all]
 */
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import vm from "node:vm";
import { gzipSync } from "node:zlib";
import { report } from "./harness";

const DIST = process.env.NEXT_DIST_DIR ?? ".next";
const FIELD_LIMIT_KB = 170;
const OFFICE_LIMIT_KB = 230;

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : [full];
  });
}

const gzipCache = new Map<string, number>();
export function gzipBytes(file: string): number {
  let n = gzipCache.get(file);
  if (n === undefined) {
    n = gzipSync(readFileSync(path.join(DIST, file)), { level: 6 }).byteLength;
    gzipCache.set(file, n);
  }
  return n;
}

/** The route (with its group folders removed) and the chunks its first load needs. */
export function routeChunks(): { route: string; files: string[] }[] {
  const build = JSON.parse(readFileSync(path.join(DIST, "build-manifest.json"), "utf8")) as {
    rootMainFiles?: string[];
  };
  const root = build.rootMainFiles ?? [];
  const appDir = path.join(DIST, "server", "app");
  return walk(appDir)
    .filter((f) => f.endsWith("page_client-reference-manifest.js"))
    .map((file) => {
      const sandbox: {
        globalThis?: unknown;
        __RSC_MANIFEST?: Record<string, { entryJSFiles?: Record<string, string[]> }>;
      } = {};
      sandbox.globalThis = sandbox;
      vm.runInNewContext(readFileSync(file, "utf8"), sandbox);
      const manifests = Object.values(sandbox.__RSC_MANIFEST ?? {});
      const entry = manifests.flatMap((m) => Object.values(m.entryJSFiles ?? {}).flat());
      const files = [...new Set([...root, ...entry])].map((f) => f.replace(/^\/?_next\//, ""));
      const rel = path.relative(appDir, path.dirname(file));
      const route =
        "/" +
        rel
          .split(path.sep)
          .filter((s) => s && !/^\(.*\)$/.test(s))
          .join("/");
      return { route: route === "/." ? "/" : route, files };
    })
    .filter((r) => !r.route.startsWith("/_"))
    .sort((a, b) => a.route.localeCompare(b.route));
}

export const isFieldRoute = (route: string) => /^\/(field|offline|sign-in)(\/|$)/.test(route);

function main() {
  const rows = routeChunks().map((r) => ({ ...r, kb: r.files.reduce((n, f) => n + gzipBytes(f), 0) / 1024 }));
  if (!rows.length) throw new Error(`no page manifests under ${DIST}/server/app: run npm run build first`);
  console.log("first-load JavaScript per route (gzip):");
  for (const r of rows)
    console.log(`  ${r.route.padEnd(56)} ${r.kb.toFixed(1).padStart(6)} KB  ${r.files.length} files`);
  const field = rows.filter((r) => isFieldRoute(r.route));
  const office = rows.filter((r) => !isFieldRoute(r.route));
  const worst = (list: typeof rows) => list.reduce((a, b) => (b.kb > a.kb ? b : a));
  for (const r of field)
    report({
      figure: `first-load JS ${r.route}`,
      value: `${r.kb.toFixed(0)} KB gzip`,
      target: `≤ ${FIELD_LIMIT_KB} KB`,
      holds: r.kb <= FIELD_LIMIT_KB,
    });
  const overOffice = office.filter((r) => r.kb > OFFICE_LIMIT_KB);
  const heaviest = worst(office);
  report({
    figure: `first-load JS, heaviest office route (${heaviest.route})`,
    value: `${heaviest.kb.toFixed(0)} KB gzip; ${overOffice.length} of ${office.length} office routes over`,
    target: `≤ ${OFFICE_LIMIT_KB} KB`,
    holds: overOffice.length === 0,
  });
  for (const r of overOffice)
    report({
      figure: `first-load JS ${r.route}`,
      value: `${r.kb.toFixed(0)} KB gzip`,
      target: `≤ ${OFFICE_LIMIT_KB} KB`,
      holds: false,
    });
  const shared = rows.reduce<string[]>((acc, r, i) => (i === 0 ? r.files : acc.filter((f) => r.files.includes(f))), []);
  console.log(
    `  shared by every route: ${(shared.reduce((n, f) => n + gzipBytes(f), 0) / 1024).toFixed(1)} KB gzip in ${shared.length} files`,
  );
}

if (process.argv[1]?.endsWith("page-weight.ts")) main();
