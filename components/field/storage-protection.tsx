"use client";
import { useState } from "react";
import { useField } from "./field-provider";

/**
 * "Storage: not protected" in the sync bar, as a key that says what it means: the browser has not
 * promised to keep this site's storage (navigator.storage.persist refused), so it may clear it
 * under storage pressure, and records not yet sent would go with it. Offers to ask again. Folded
 * by default, so it takes no room from the record form.
 */
export function StorageProtection({ pending }: { pending: number }) {
  const { db } = useField();
  const [open, setOpen] = useState(false);
  const [asking, setAsking] = useState(false);
  const [answer, setAnswer] = useState<string | null>(null);

  async function askAgain() {
    setAsking(true);
    try {
      const granted = Boolean(await navigator.storage?.persist?.());
      // Already loaded with the shell's database code (lib/offline/open-field.ts), so no wait and no signal needed.
      const { updateSyncMeta } = await import("@/lib/offline/db");
      await updateSyncMeta(db, { storagePersisted: granted });
      setAnswer(
        granted
          ? "The browser now protects this tablet's storage."
          : "The browser refused again. It decides by itself; installing the field log as an app usually helps.",
      );
    } catch (error) {
      setAnswer(`The browser could not be asked: ${(error as Error).message}`);
    } finally {
      setAsking(false);
    }
  }

  return (
    <div>
      <button
        type="button"
        className="flex min-h-touch flex-col rounded-md bg-signal-stop-bg px-3 py-1 text-left text-signal-stop"
        aria-expanded={open}
        aria-controls="storage-protection-help"
        onClick={() => setOpen(!open)}
        data-testid="storage"
      >
        <span className="text-label font-semibold uppercase">Storage</span>
        <span className="text-body font-bold underline underline-offset-4">not protected ›</span>
      </button>
      {open && (
        <div
          id="storage-protection-help"
          role="region"
          aria-label="What unprotected storage means"
          className="fixed inset-x-4 top-20 z-30 mx-auto grid max-w-xl gap-2 rounded-md border-2 border-signal-stop bg-white p-4 text-ink shadow-lg"
          data-testid="storage-help"
        >
          <p>
            This browser has not promised to keep the field log&apos;s storage. When the tablet runs short of space, or
            after a long time unused, it may clear it without asking.
          </p>
          <p className="font-bold">
            {pending > 0
              ? `${pending} record${pending === 1 ? "" : "s"} saved here and not sent yet would be lost with it: send them as soon as there is signal.`
              : "Nothing is waiting to be sent now: every record saved so far is on the server."}
          </p>
          <p>Records already sent are safe on the server. Installing the field log as an app makes browsers keep it.</p>
          <div className="flex flex-wrap items-center gap-2">
            <button type="button" className="btn-quiet" onClick={askAgain} disabled={asking}>
              {asking ? "Asking…" : "Ask the browser again"}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
              Close
            </button>
          </div>
          {answer && (
            <p role="status" className="font-semibold">
              {answer}
            </p>
          )}
        </div>
      )}
    </div>
  );
}
