/// <reference lib="webworker" />
import { clientsClaim } from "workbox-core";
import { ExpirationPlugin } from "workbox-expiration";
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute, type PrecacheEntry } from "workbox-precaching";
import { NavigationRoute, registerRoute, setCatchHandler } from "workbox-routing";
import { NetworkFirst, NetworkOnly } from "workbox-strategies";

/**
 * Tautline's offline worker. It keeps the app shell, the field-log pages and an offline page,
 * and a copy of downloaded reference data. It never holds records: those wait in the page's
 * IndexedDB outbox. A new version waits until the page asks it to take over (the page does that
 * only when no form is dirty and the outbox is empty).
 */

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: (PrecacheEntry | string)[] };

cleanupOutdatedCaches();
// The field pages are one shell each; the pour and tendon ride in the query string.
precacheAndRoute(self.__WB_MANIFEST, { ignoreURLParametersMatching: [/.*/], cleanURLs: false, directoryIndex: "" });

// Downloaded reference data: network first, the last copy when there is no signal.
registerRoute(
  ({ url, request }) => request.method === "GET" && url.pathname.startsWith("/api/field/"),
  new NetworkFirst({
    cacheName: "tautline-field-reference",
    networkTimeoutSeconds: 8,
    plugins: [new ExpirationPlugin({ maxEntries: 60, maxAgeSeconds: 14 * 86_400 })],
  }),
);

// Every other page needs the network; without it the offline page says so.
registerRoute(new NavigationRoute(new NetworkOnly()));
setCatchHandler(async ({ request }) => {
  if (request.destination === "document") return (await matchPrecache("/offline")) ?? Response.error();
  return Response.error();
});

self.addEventListener("message", (event) => {
  if ((event.data as { type?: string } | null)?.type === "SKIP_WAITING") void self.skipWaiting();
});
clientsClaim();
