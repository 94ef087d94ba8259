/**
 * Everything the field shell needs from the tablet's database, in one module that the shell loads
 * on demand (`components/field/field-provider.tsx`), so Dexie is not part of a field page's first
 * load: the page's frame paints first, then this opens IndexedDB, starts the sync client and
 * reports what the outbox holds and how the last sync went. The offline worker precaches every
 * chunk, so this loads without signal as well.
 */
import { liveQuery } from "dexie";
import {
  EMPTY_SYNC_META,
  fieldDb,
  readMeta,
  updateSyncMeta,
  writeMeta,
  type FieldDb,
  type SessionMeta,
  type SyncMeta,
} from "./db";
import { meResponseSchema } from "@/lib/schemas/me";
import { outboxStatus, type OutboxStatus } from "./outbox";
import { uploadPhotos } from "./photo-upload";
import { SyncClient } from "./sync-client";

export interface FieldRuntime {
  db: FieldDb;
  client: SyncClient;
  /** Sync now: resets the backoff, pushes, pulls, then uploads waiting photos. */
  syncNow: () => Promise<void>;
  /** After a save: a round at once when there is signal (within the backoff), then waiting photos. */
  sendSaved: () => void;
  /**
   * Asks the server who is signed in, asks once for storage protection, starts the sync client's
   * triggers and reports the outbox and the sync record whenever they change; returns the stop.
   */
  start: (watch: { outbox: (status: OutboxStatus) => void; sync: (meta: SyncMeta) => void }) => () => void;
}

/** What the crew reads when the server's word on who is signed in cannot be read. */
export const UNREADABLE_SESSION =
  "The server's answer about who is signed in could not be read; the tablet keeps the person it had.";

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
  // The person is kept only when the answer matches its contract; otherwise the one we had stays.
  const parsed = meResponseSchema.safeParse(await response.json().catch(() => null));
  if (!parsed.success) {
    await updateSyncMeta(db, { lastError: UNREADABLE_SESSION });
    return;
  }
  const me = parsed.data;
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

/** The shell's database (the page's one connection; a test passes its own) with its sync client. */
export function openField(db: FieldDb = fieldDb()): FieldRuntime {
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
    start: (watch) => {
      let stopClient: (() => void) | undefined;
      let stopped = false;
      void (async () => {
        await refreshSession(db);
        await protectStorage(db);
        if (stopped) return;
        stopClient = client.start({ onRound: (outcome) => outcome.kind === "done" && void uploadPhotos(db) });
      })();
      const onOnline = () => void refreshSession(db);
      window.addEventListener("online", onOnline);
      const outbox = liveQuery(() => outboxStatus(db)).subscribe({ next: watch.outbox });
      const sync = liveQuery(async () => ({ ...EMPTY_SYNC_META, ...(await readMeta<SyncMeta>(db, "sync")) })).subscribe(
        { next: watch.sync },
      );
      return () => {
        stopped = true;
        stopClient?.();
        window.removeEventListener("online", onOnline);
        outbox.unsubscribe();
        sync.unsubscribe();
      };
    },
  };
}
