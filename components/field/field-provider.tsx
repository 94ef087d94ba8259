"use client";
import { createContext, useContext, useEffect, useMemo, useState, type ReactNode } from "react";
import type { SyncMeta } from "@/lib/offline/db";
import type { FieldRuntime } from "@/lib/offline/open-field";
import type { OutboxStatus } from "@/lib/offline/outbox";

export interface FieldApi extends Omit<FieldRuntime, "start"> {
  /** What the outbox holds, read once for every screen that shows or waits on it (undefined while loading). */
  outbox: OutboxStatus | undefined;
  /** The sync record (last confirmed sync, sign-in needed, storage protection); undefined while loading. */
  syncMeta: SyncMeta | undefined;
}

const FieldContext = createContext<FieldApi | null>(null);

/** The tablet's database and sync client, for the screens that render only once they are open (see FieldGate). */
export function useField(): FieldApi {
  const api = useContext(FieldContext);
  if (!api) throw new Error("useField before the tablet's database is open (render it inside FieldGate)");
  return api;
}

/** The same, or null while the tablet's database is still being opened (the shell's own parts). */
export function useFieldIfOpen(): FieldApi | null {
  return useContext(FieldContext);
}

// The database code starts loading as soon as this module runs in the browser, beside the page's
// hydration rather than after it; the page has painted from the server's HTML by then.
let opening: Promise<typeof import("@/lib/offline/open-field")> | undefined;
const openingRuntime = () => (opening ??= import("@/lib/offline/open-field"));
if (typeof window !== "undefined") void openingRuntime().catch(() => undefined);

const openingProblem =
  "The field log could not open this tablet's storage code. Reload the page; if it keeps happening, reload once with signal.";

/**
 * Opens the tablet's database after the page has painted: the Dexie code and the sync client load
 * on demand (`lib/offline/open-field.ts`), so they are not part of any field page's first load.
 * Until then the shell shows its frame and each screen its placeholder (FieldGate).
 */
export function FieldProvider({ children }: { children: ReactNode }) {
  const [runtime, setRuntime] = useState<FieldRuntime | null>(null);
  const [outbox, setOutbox] = useState<OutboxStatus>();
  const [syncMeta, setSyncMeta] = useState<SyncMeta>();
  const [problem, setProblem] = useState(false);

  useEffect(() => {
    let cancelled = false;
    let stop: (() => void) | undefined;
    openingRuntime().then(
      ({ openField }) => {
        if (cancelled) return;
        const opened = openField();
        stop = opened.start({ outbox: setOutbox, sync: setSyncMeta });
        setRuntime(opened);
      },
      () => !cancelled && setProblem(true),
    );
    return () => {
      cancelled = true;
      stop?.();
    };
  }, []);

  const value = useMemo<FieldApi | null>(() => {
    if (!runtime) return null;
    const { db, client, syncNow, sendSaved } = runtime;
    return { db, client, syncNow, sendSaved, outbox, syncMeta };
  }, [runtime, outbox, syncMeta]);
  return (
    <FieldContext.Provider value={value}>
      {problem && (
        <p role="alert" className="bg-signal-stop-bg px-4 py-2 font-semibold text-signal-stop">
          {openingProblem}
        </p>
      )}
      {children}
    </FieldContext.Provider>
  );
}

/** Renders its children once the tablet's database is open, the placeholder until then. */
export function FieldGate({ children, placeholder }: { children: ReactNode; placeholder: ReactNode }) {
  return useFieldIfOpen() ? children : placeholder;
}
