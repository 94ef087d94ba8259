import type { z } from "zod/mini";
import {
  availablePoursResponseSchema,
  pullResponseSchema,
  pushResponseSchema,
  type AvailablePour,
} from "@/lib/schemas/sync-response";
import { backoffDelayMs } from "@/lib/retry/backoff";
import { deviceId, readMeta, updateSyncMeta, type FieldDb, type SessionMeta } from "./db";
import { applyPushResults, notePushFailure, pendingOps } from "./outbox";
import { applyPull } from "./reference";

/** What the crew reads when the server cannot be reached: no browser jargon. */
export const NO_CONNECTION =
  "No connection to the server. Records stay on this tablet and are sent when there is signal.";

/**
 * What the crew reads when the server's answer does not match the contract (lib/schemas/sync-response.ts):
 * nothing from it is stored, the outbox is kept and sent again after the usual wait.
 */
export const UNREADABLE_ANSWER =
  "The server's answer could not be read, so nothing from it was stored. Records stay on this tablet and are sent again shortly.";

/**
 * Moves the outbox to the server and the server's changes to the tablet. Runs in the page (the
 * service worker never holds records). One tab at a time: a Web Lock guards each round, and a
 * tab that finds it taken leaves the round to the holder. Network errors, 5xx and 429 back off
 * exponentially with full jitter (capped at five minutes); going online or "Sync now" resets the
 * wait. A 401 keeps everything and asks for sign-in again. Every answer is parsed against its
 * schema before anything of it is stored; one that does not match is treated like a lost
 * connection (kept, retried later) with its own words.
 */

export type Fetch = (input: string, init?: RequestInit) => Promise<Response>;

export interface LockManagerLike {
  request<T>(name: string, options: { ifAvailable: true }, callback: (lock: unknown) => Promise<T>): Promise<T>;
}

export interface SyncClientOptions {
  db: FieldDb;
  fetch?: Fetch;
  locks?: LockManagerLike | null;
  now?: () => number;
  random?: () => number;
  batchSize?: number;
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** Whether the browser says there is signal (navigator.onLine by default). */
  online?: () => boolean;
}

export type RoundOutcome =
  | { kind: "done"; pushed: number; confirmed: number; attention: number; pulled: boolean }
  | { kind: "busy" }
  | { kind: "waiting"; untilMs: number }
  | { kind: "signed-out" }
  | { kind: "offline"; retryInMs: number; message: string };

class Unauthenticated extends Error {}
class Retryable extends Error {}

const LOCK_NAME = "tautline-sync";

export class SyncClient {
  readonly db: FieldDb;
  private readonly fetch: Fetch;
  private readonly locks: LockManagerLike | null;
  private readonly now: () => number;
  private readonly random: () => number;
  private readonly batchSize: number;
  private readonly baseDelayMs: number;
  private readonly maxDelayMs: number;
  private readonly online: () => boolean;
  private failures = 0;
  private nextAttemptAt = 0;
  private running: Promise<RoundOutcome> | null = null;
  private stopTriggers: (() => void) | null = null;

  constructor(options: SyncClientOptions) {
    this.db = options.db;
    this.fetch = options.fetch ?? ((input, init) => globalThis.fetch(input, init));
    this.locks =
      options.locks === undefined
        ? typeof navigator !== "undefined" && "locks" in navigator
          ? (navigator.locks as unknown as LockManagerLike)
          : null
        : options.locks;
    this.now = options.now ?? Date.now;
    this.random = options.random ?? Math.random;
    this.batchSize = options.batchSize ?? 25;
    this.baseDelayMs = options.baseDelayMs ?? 2_000;
    this.maxDelayMs = options.maxDelayMs ?? 300_000;
    this.online = options.online ?? (() => typeof navigator === "undefined" || navigator.onLine !== false);
  }

  /**
   * A record was just saved: with signal, a round at once instead of waiting for the timer. Never
   * forced, so the backoff and the lock still hold; a round already running may have read the
   * outbox before the save, so the new round follows it. Without signal nothing is tried (the
   * `online` event starts a round later). Answers null when nothing was tried.
   */
  sendSoon(): Promise<RoundOutcome | null> {
    if (!this.online()) return Promise.resolve(null);
    const running = this.running;
    if (running)
      return running.then(
        () => this.sync(),
        () => this.sync(),
      );
    return this.sync();
  }

  /** One round now, unless backing off. `force` (Sync now, online) resets the backoff first. */
  sync(options: { force?: boolean } = {}): Promise<RoundOutcome> {
    if (options.force) {
      this.failures = 0;
      this.nextAttemptAt = 0;
    }
    if (this.now() < this.nextAttemptAt) return Promise.resolve({ kind: "waiting", untilMs: this.nextAttemptAt });
    // Rounds in one tab never overlap; a second caller shares the running round.
    this.running ??= this.lockedRound().finally(() => {
      this.running = null;
    });
    return this.running;
  }

  private async lockedRound(): Promise<RoundOutcome> {
    if (!this.locks) return this.round();
    return this.locks.request(LOCK_NAME, { ifAvailable: true }, async (lock) =>
      lock ? this.round() : { kind: "busy" as const },
    );
  }

  private async call(url: string, init?: RequestInit): Promise<Response> {
    let response: Response;
    try {
      response = await this.fetch(url, { credentials: "same-origin", cache: "no-store", ...init });
    } catch {
      // The browser's own words ("Failed to fetch", "NetworkError…") mean nothing at the slab edge.
      throw new Retryable(NO_CONNECTION);
    }
    if (response.status === 401) throw new Unauthenticated("Signed out");
    if (response.status >= 500 || response.status === 429 || response.status === 408)
      throw new Retryable(`The server answered ${response.status}.`);
    return response;
  }

  /** The answer's body parsed against its schema; anything else throws UNREADABLE_ANSWER. */
  private async read<T>(response: Response, schema: z.ZodMiniType<T>, what: string): Promise<T> {
    let body: unknown;
    try {
      body = await response.json();
    } catch {
      console.warn(`${what}: the server's answer is not JSON.`);
      throw new Retryable(UNREADABLE_ANSWER);
    }
    const parsed = schema.safeParse(body);
    if (!parsed.success) {
      // For whoever looks at the console; the crew reads UNREADABLE_ANSWER.
      const where = parsed.error.issues.slice(0, 5).map((i) => `${i.path.join(".") || "(answer)"}: ${i.message}`);
      console.warn(`${what}: the server's answer does not match the contract.`, where);
      throw new Retryable(UNREADABLE_ANSWER);
    }
    return parsed.data;
  }

  private async round(): Promise<RoundOutcome> {
    const db = this.db;
    const session = await readMeta<SessionMeta>(db, "session");
    await updateSyncMeta(db, { lastAttemptAt: new Date(this.now()).toISOString() });
    if (!session) return { kind: "signed-out" };
    let pushed = 0;
    let confirmed = 0;
    let attention = 0;
    let inFlight: number[] = [];
    try {
      const device = await deviceId(db);
      for (;;) {
        const batch = await pendingOps(db, session.userId, this.batchSize);
        if (!batch.length) break;
        inFlight = batch.map((e) => e.seq!);
        const response = await this.call("/api/sync/push", {
          method: "POST",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify({
            deviceId: device,
            ops: batch.map((e) => ({
              opId: e.opId,
              kind: e.kind,
              recordId: e.recordId,
              ...(e.baseVersion ? { baseVersion: e.baseVersion } : {}),
              payload: e.payload,
            })),
          }),
        });
        if (!response.ok) {
          // A 4xx for the whole batch (say 403 after a role change) leaves the ops waiting.
          const message = `The server refused the batch (${response.status}).`;
          await notePushFailure(db, inFlight, message);
          await updateSyncMeta(db, { lastError: message });
          break;
        }
        const body = await this.read(response, pushResponseSchema, "push");
        const applied = await applyPushResults(db, body.results);
        inFlight = [];
        pushed += batch.length;
        confirmed += applied.confirmed;
        attention += applied.attention;
        await updateSyncMeta(db, {
          lastConfirmedSyncAt: new Date(this.now()).toISOString(),
          needsSignIn: false,
          lastError: null,
        });
        // Ops the server could not take now stay pending; wait (with backoff) before sending them again.
        if (body.results.some((r) => r.status === "retry-later"))
          throw new Retryable("The server asked for some changes to be sent again shortly.");
        if (batch.length < this.batchSize) break;
      }
      const pulled = await this.pullAll();
      this.failures = 0;
      this.nextAttemptAt = 0;
      return { kind: "done", pushed, confirmed, attention, pulled };
    } catch (error) {
      if (error instanceof Unauthenticated) {
        await updateSyncMeta(db, {
          needsSignIn: true,
          lastError: "Signed out: sign in again to send what is waiting. Nothing is lost.",
        });
        return { kind: "signed-out" };
      }
      if (error instanceof Retryable) {
        if (inFlight.length) await notePushFailure(db, inFlight, error.message);
        this.failures++;
        // Full jitter: many tablets regaining signal together do not come back together.
        const wait = backoffDelayMs(this.failures, {
          baseMs: this.baseDelayMs,
          capMs: this.maxDelayMs,
          random: this.random,
        });
        this.nextAttemptAt = this.now() + wait;
        await updateSyncMeta(db, { lastError: error.message });
        return { kind: "offline", retryInMs: wait, message: error.message };
      }
      throw error;
    }
  }

  /** Pulls every downloaded pour, grouped by the cursor each was last pulled at. */
  private async pullAll(): Promise<boolean> {
    const pours = (await this.db.pours.toArray()).filter((p) => !p.unavailable);
    if (!pours.length) return false;
    const byCursor = new Map<string, string[]>();
    for (const p of pours) byCursor.set(p.cursor, [...(byCursor.get(p.cursor) ?? []), p.id]);
    for (const [cursor, ids] of byCursor) {
      for (let i = 0; i < ids.length; i += 20) {
        const chunk = ids.slice(i, i + 20);
        const response = await this.call(`/api/sync/pull?cursor=${cursor}&pours=${chunk.join(",")}`);
        if (!response.ok) continue;
        const pull = await this.read(response, pullResponseSchema, "pull");
        await applyPull(this.db, pull, { pourIds: chunk });
      }
    }
    await updateSyncMeta(this.db, { lastConfirmedSyncAt: new Date(this.now()).toISOString(), needsSignIn: false });
    return true;
  }

  /** Downloads one pour for offline work. */
  async download(pourId: string): Promise<{ ok: true } | { ok: false; status: number; message: string }> {
    let response: Response;
    try {
      response = await this.call(`/api/field/pours/${pourId}`);
    } catch (error) {
      if (error instanceof Unauthenticated) {
        await updateSyncMeta(this.db, { needsSignIn: true });
        return { ok: false, status: 401, message: "Sign in again to download." };
      }
      return { ok: false, status: 0, message: (error as Error).message };
    }
    if (!response.ok) return { ok: false, status: response.status, message: `The server answered ${response.status}.` };
    let pull;
    try {
      pull = await this.read(response, pullResponseSchema, "download");
    } catch (error) {
      return { ok: false, status: response.status, message: (error as Error).message };
    }
    await applyPull(this.db, pull, { pourIds: [pourId], downloadedAt: new Date(this.now()).toISOString() });
    return { ok: true };
  }

  /** The pours the signed-in person may take out, for the download list; an error in the crew's words. */
  async availablePours(): Promise<{ pours: AvailablePour[] | null; error: string | null }> {
    let response: Response;
    try {
      response = await this.fetch("/api/field/pours", { credentials: "same-origin", cache: "no-store" });
    } catch {
      return { pours: null, error: "No signal: pours can be taken out once the tablet is online again." };
    }
    if (response.status === 401) return { pours: null, error: "Sign in to see the pours you can take out." };
    if (!response.ok) return { pours: null, error: `The server answered ${response.status}; try again.` };
    try {
      return {
        pours: (await this.read(response, availablePoursResponseSchema, "pours to take out")).pours,
        error: null,
      };
    } catch {
      return { pours: null, error: "The server's list of pours could not be read; try again." };
    }
  }

  /**
   * The page's triggers: app start, `online`, the tab becoming visible, a timer, and whatever
   * calls sync({ force: true }) (the Sync now button). Returns a function that removes them.
   */
  start(options: { intervalMs?: number; onRound?: (outcome: RoundOutcome) => void } = {}): () => void {
    this.stopTriggers?.();
    const run = (force = false) => {
      void this.sync({ force }).then(options.onRound, () => undefined);
    };
    const onOnline = () => run(true);
    const onVisible = () => {
      if (document.visibilityState === "visible") run();
    };
    window.addEventListener("online", onOnline);
    document.addEventListener("visibilitychange", onVisible);
    const timer = window.setInterval(() => run(), options.intervalMs ?? 30_000);
    run();
    this.stopTriggers = () => {
      window.removeEventListener("online", onOnline);
      document.removeEventListener("visibilitychange", onVisible);
      window.clearInterval(timer);
      this.stopTriggers = null;
    };
    return this.stopTriggers;
  }
}
