"use client";

import Link from "next/link";
import { useEffect, useState } from "react";
import type { OutboxStatus } from "@/lib/offline/outbox";

// The tablet's database code (Dexie, about 30 KB gzip) loads after the page has painted, and not
// at all with a prefetch of this page from a link on another office screen.
async function readOutbox(): Promise<OutboxStatus> {
  const [{ fieldDb }, { outboxStatus }] = await Promise.all([
    import("@/lib/offline/db"),
    import("@/lib/offline/outbox"),
  ]);
  return outboxStatus(fieldDb());
}

/** What this tablet still holds for the server, read from its own database. */
export function DeviceOutbox() {
  const [status, setStatus] = useState<OutboxStatus | null | "unavailable">(null);
  useEffect(() => {
    let live = true;
    readOutbox()
      .then((s) => live && setStatus(s))
      .catch(() => live && setStatus("unavailable"));
    return () => {
      live = false;
    };
  }, []);
  if (status === null) return <p className="text-ink-soft">Reading this tablet&apos;s outbox…</p>;
  if (status === "unavailable") return <p className="text-ink-soft">This browser keeps no field records.</p>;
  return (
    <p data-testid="device-outbox">
      On this tablet: <strong>{status.pending}</strong> record{status.pending === 1 ? "" : "s"} waiting to sync
      {status.attention ? `, ${status.attention} needing attention` : ""}
      {status.photosQueued
        ? `, ${status.photosQueued} photo${status.photosQueued === 1 ? "" : "s"} to upload`
        : ""}. <Link href="/field">Open the field log</Link>
    </p>
  );
}
