"use client";
import { useState } from "react";
import { useFieldIfOpen } from "./field-provider";
import { StorageProtection } from "./storage-protection";
import { formatShortAge } from "@/lib/format/dates";
import { recentClockTime, useNow, useOnline } from "./use-live";

function Item({
  label,
  value,
  tone = "plain",
  testId,
}: {
  label: string;
  value: string;
  tone?: "plain" | "warn";
  testId: string;
}) {
  return (
    <div
      className={`flex flex-col rounded-md px-3 py-1 ${tone === "warn" ? "bg-signal-stop-bg text-signal-stop" : ""}`}
      data-testid={testId}
    >
      <span className="text-label font-semibold uppercase">{label}</span>
      <span className="text-body font-bold">{value}</span>
    </div>
  );
}

/**
 * Always on screen: what waits to be sent, since when, the last sync the server confirmed, what needs a person, and
 * storage protection. It paints with the page and fills in once the tablet's database is open ("…" until then).
 */
export function SyncStatusBar() {
  const field = useFieldIfOpen();
  const status = field?.outbox;
  const meta = field?.syncMeta;
  const now = useNow();
  const online = useOnline();
  const [busy, setBusy] = useState(false);

  const pending = status?.pending ?? 0;
  const photos = status?.photosQueued ?? 0;
  return (
    <section
      aria-label="Sync status"
      className="sticky top-0 z-20 border-b-2 border-ink bg-white"
      data-testid="sync-status"
    >
      <div className="flex flex-wrap items-center gap-x-2 gap-y-1 px-4 py-2">
        <span
          className={`mr-2 inline-flex items-center gap-2 font-bold ${online ? "" : "text-signal-stop"}`}
          data-testid="connection"
        >
          <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true">
            {online ? (
              <path
                d="M2 9a15 15 0 0 1 20 0M5 13a10 10 0 0 1 14 0M8.5 16.5a5 5 0 0 1 7 0M12 20h.01"
                fill="none"
                stroke="currentColor"
                strokeWidth="2.5"
                strokeLinecap="round"
              />
            ) : (
              <path
                d="M3 3l18 18M8.5 16.5a5 5 0 0 1 7 0M12 20h.01M5 13a10 10 0 0 1 5-2.8M2 9a15 15 0 0 1 5.5-3.5"
                fill="none"
                stroke="currentColor"
                strokeWidth="2.5"
                strokeLinecap="round"
              />
            )}
          </svg>
          {online ? "Online" : "No signal"}
        </span>
        <Item
          testId="pending-count"
          label="Waiting to send"
          value={status ? `${pending} record${pending === 1 ? "" : "s"}` : "…"}
        />
        <Item
          testId="oldest-pending"
          label="Oldest waiting"
          value={status?.oldestPendingAt ? formatShortAge(status.oldestPendingAt, now) : "none"}
        />
        <Item
          testId="last-sync"
          label="Last confirmed sync"
          value={
            meta === undefined
              ? "…"
              : meta.lastConfirmedSyncAt
                ? `${recentClockTime(meta.lastConfirmedSyncAt, now)} (${formatShortAge(meta.lastConfirmedSyncAt, now)})`
                : "never"
          }
        />
        <Item
          testId="attention-count"
          label="Records the server refused"
          value={status ? String(status.attention) : "…"}
          tone={status?.attention ? "warn" : "plain"}
        />
        {photos > 0 && <Item testId="photos-waiting" label="Photos to upload" value={String(photos)} />}
        {meta?.storagePersisted === false ? (
          <StorageProtection pending={pending} />
        ) : (
          <Item
            testId="storage"
            label="Storage"
            value={meta?.storagePersisted === null || meta === undefined ? "checking…" : "protected"}
          />
        )}
        <button
          type="button"
          className="btn-primary ml-auto"
          disabled={busy || !field}
          onClick={async () => {
            if (!field) return;
            setBusy(true);
            try {
              await field.syncNow();
            } finally {
              setBusy(false);
            }
          }}
        >
          {busy ? "Syncing…" : "Sync now"}
        </button>
      </div>
      {meta?.needsSignIn && (
        <p
          className="flex flex-wrap items-center gap-3 bg-signal-stop-bg px-4 py-2 font-semibold text-signal-stop"
          role="alert"
        >
          You are signed out. Everything waiting stays on this tablet until you sign in again.
          <a className="btn-quiet" href="/sign-in?callbackUrl=/field">
            Sign in again
          </a>
        </p>
      )}
      {!meta?.needsSignIn && meta?.lastError && pending > 0 && (
        <p className="px-4 pb-2 text-body text-ink-soft" data-testid="sync-error">
          Last try: {meta.lastError} It tries again by itself.
        </p>
      )}
    </section>
  );
}
