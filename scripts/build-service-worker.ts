/**
 * Builds public/sw.js after `next build`: bundles service-worker/sw.ts with esbuild, then lets
 * workbox-build inject the precache manifest: the build's static chunks, the field-log pages, the
 * offline page, the manifest and the icons, each page revisioned by the build id.
 */
import { createHash } from "node:crypto";
import { mkdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { build } from "esbuild";
import { injectManifest } from "workbox-build";

const distDir = process.env.NEXT_DIST_DIR || ".next";
const buildId = readFileSync(path.join(distDir, "BUILD_ID"), "utf8").trim();
const fileRevision = (file: string) => createHash("sha256").update(readFileSync(file)).digest("hex").slice(0, 16);

const PAGES = ["/field", "/field/pour", "/field/sign", "/offline"];
const PUBLIC_FILES = [
  "manifest.webmanifest",
  "icon.svg",
  "icons/field-log.svg",
  "icons/field-log-192.png",
  "icons/field-log-512.png",
];

async function main() {
  const workDir = path.join(distDir, "service-worker");
  mkdirSync(workDir, { recursive: true });
  const bundled = path.join(workDir, "sw.bundle.js");
  await build({
    entryPoints: ["service-worker/sw.ts"],
    outfile: bundled,
    bundle: true,
    format: "iife",
    target: "es2020",
    minify: true,
    define: { "process.env.NODE_ENV": '"production"' },
    tsconfig: "service-worker/tsconfig.json",
    logLevel: "warning",
  });
  const { count, size, warnings } = await injectManifest({
    swSrc: bundled,
    swDest: "public/sw.js",
    globDirectory: distDir,
    globPatterns: ["static/**/*.{js,css,woff2,svg,png}"],
    modifyURLPrefix: { "static/": "/_next/static/" },
    // Hashed file names already carry their version.
    dontCacheBustURLsMatching: /^\/_next\/static\//,
    additionalManifestEntries: [
      ...PAGES.map((url) => ({ url, revision: buildId })),
      ...PUBLIC_FILES.map((file) => ({ url: `/${file}`, revision: fileRevision(path.join("public", file)) })),
    ],
    maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
  });
  for (const w of warnings) console.warn(w);
  console.log(
    `service worker: public/sw.js precaches ${count} files (${(size / 1024).toFixed(0)} KiB), build ${buildId}`,
  );
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
