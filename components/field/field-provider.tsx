"use client";
import { createContext, useContext, useEffect, useMemo, useState, type ReactNode } from "react";
import { fieldDb, readMeta, updateSyncMeta, writeMeta, type FieldDb, type SessionMeta } from "@/lib/offline/db";
import { outboxStatus, type OutboxStatus } from "@/lib/offline/outbox";
import { uploadPhotos } from "@/lib/offline/photo-upload";
import { SyncClient } from "@/lib/offline/sync-client";
import { useLiveQuery as useLive } from "dexie-react-hooks";

interface FieldApi {
  db: FieldDb;
  client: SyncClient;
  /** Sync now: resets the backoff, pushes, pulls, then uploads waiting photos. */
  syncNow: () => Promise<void>;
  /** After a save: a round at once when there is signal (within the backoff), then waiting photos. */
  sendSaved: () => void;
  /** What the outbox holds, read once for every screen that shows or waits on it (undefined while loading). */
  outbox: OutboxStatus | undefined;
}

const FieldContext = createContext<FieldApi | null>(null);

export function useField(): FieldApi {
  const api = useContext(FieldContext);
  if (!api) throw new Error("useField outside FieldProvider");
  return api;
}

interface Me {
  id: string;
  name: string;
  email: string;
  memberships: { projectId: string; projectName: string; projectCode: string; role: string }[];
}

/** Who is signed in, asked of the server when there is signal and kept for offline work. */
async function refreshSession(db: FieldDb): Promise<void> {
  let response: Response;
  try {
    response = await fetch("/api/me", { credentials: "same-origin", cache: "no-store" });
  } catch {
    return; // offline: keep the person we had
  }
  if (response.status === 401) {
    await updateSyncMeta(db, { needsSignIn: true });
    return;
  }
  if (!response.ok) return;
  const me = (await response.json()) as Me;
  const previous = await readMeta<SessionMeta>(db, "session");
  const session: SessionMeta = {
    userId: me.id,
    name: me.name,
    email: me.email,
    projects: me.memberships
      .filter((m) => m.role === "crew")
      .map(({ projectId, projectName, projectCode }) => ({ projectId, projectName, projectCode })),
    checkedAt: new Date().toISOString(),
  };
  await writeMeta(db, "session", session);
  await updateSyncMeta(db, { needsSignIn: false, ...(previous?.userId !== me.id ? { lastError: null } : {}) });
}

/** Asks the browser once to keep this site's storage through storage pressure, and remembers the answer. */
async function protectStorage(db: FieldDb): Promise<void> {
  if (typeof navigator === "undefined" || !navigator.storage?.persist) {
    await updateSyncMeta(db, { storagePersisted: false });
    return;
  }
  const already = await navigator.storage.persisted();
  const persisted = already || (await navigator.storage.persist());
  await updateSyncMeta(db, { storagePersisted: persisted });
}

export function FieldProvider({ children }: { children: ReactNode }) {
  const [api] = useState<Omit<FieldApi, "outbox">>(() => {
    const db = fieldDb();
    const client = new SyncClient({ db });
    return {
      db,
      client,
      syncNow: async () => {
        await refreshSession(db);
        await client.sync({ force: true });
        await uploadPhotos(db);
      },
      sendSaved: () => {
        void client.sendSoon().then(
          async (outcome) => {
            if (outcome?.kind === "done") await uploadPhotos(db);
          },
          () => undefined,
        );
      },
    };
  });

  useEffect(() => {
    let stop: (() => void) | undefined;
    void (async () => {
      await refreshSession(api.db);
      await protectStorage(api.db);
      stop = api.client.start({ onRound: (outcome) => outcome.kind === "done" && void uploadPhotos(api.db) });
    })();
    const onOnline = () => void refreshSession(api.db);
    window.addEventListener("online", onOnline);
    return () => {
      stop?.();
      window.removeEventListener("online", onOnline);
    };
  }, [api]);

  const outbox = useLive(() => outboxStatus(api.db), [api]);
  const value = useMemo(() => ({ ...api, outbox }), [api, outbox]);
  return <FieldContext.Provider value={value}>{children}</FieldContext.Provider>;
}
