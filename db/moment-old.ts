import type { Db } from "./connect";

/**
 * Reads that may be a moment old: the one way a server operation says so. It takes a `MomentOld`
 * handle (the app's is `momentOld` in db/index.ts) instead of `db`, and runs its queries through
 * `read`. With a replica (DATABASE_REPLICA_URL) they go there, seconds or less behind the primary;
 * without one they go to the primary. Nothing the crew acts on, no review queue, decision, report
 * being signed or write ever goes through here: those take `db`.
 *
 * When the replica cannot be reached (refused, timed out, shutting down, too many connections, a
 * query cancelled by the replay of the primary's changes), the same read runs on the primary and a
 * line is logged; the replica is tried again after `retryAfterMs`, so an outage costs one log line
 * and one failed connection per interval, not one per request. Any other error (a missing row, a
 * bug in the query) is the read's own and is thrown as it is.
 */
export class MomentOld {
  private skipReplicaUntil = 0;

  constructor(
    private readonly primary: Db,
    private readonly replica: Db | null,
    private readonly options: { retryAfterMs?: number; log?: (line: string) => void; now?: () => number } = {},
  ) {}

  /** Whether a replica is configured (it may still be skipped for a while after a failure). */
  get hasReplica(): boolean {
    return this.replica !== null;
  }

  /** Runs `query` (reads only) on the replica, or on the primary when there is none or it is out of reach. */
  async read<T>(query: (db: Db) => Promise<T>): Promise<T> {
    const now = this.options.now ?? Date.now;
    if (!this.replica || now() < this.skipReplicaUntil) return query(this.primary);
    try {
      return await query(this.replica);
    } catch (error) {
      if (!replicaOutOfReach(error)) throw error;
      const retryAfterMs = this.options.retryAfterMs ?? 30_000;
      this.skipReplicaUntil = now() + retryAfterMs;
      (this.options.log ?? ((line) => console.error(line)))(
        `${new Date().toISOString()} read replica out of reach (${describe(error)}): reads that may be a moment old go to the primary; the replica is tried again in ${Math.round(retryAfterMs / 1000)} s`,
      );
      return query(this.primary);
    }
  }
}

/** Node's socket errors that mean the server could not be reached or went away. */
const NETWORK_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "ENOTFOUND",
  "EAI_AGAIN",
  "EPIPE",
]);

/**
 * PostgreSQL's answers that mean this server cannot serve the read now, by SQLSTATE: class 08
 * (connection exception), 28 (the replica refuses the credentials), 3D000 (no such database there),
 * 53 (out of resources: too many connections), 57 (shutting down, starting up), and 40001, which a
 * hot standby gives when it cancels a query that conflicts with replaying the primary's changes.
 */
function unusableServer(code: string): boolean {
  return /^(08|28|53|57)/.test(code) || code === "3D000" || code === "40001";
}

/** Whether an error says the replica could not serve the read, as opposed to the read failing on its own. */
export function replicaOutOfReach(error: unknown): boolean {
  if (!(error instanceof Error)) return false;
  const code = (error as { code?: unknown }).code;
  if (typeof code === "string" && (NETWORK_CODES.has(code) || (/^[0-9A-Z]{5}$/.test(code) && unusableServer(code))))
    return true;
  // Several addresses tried (localhost: ::1 and 127.0.0.1), each refused.
  if (error instanceof AggregateError && error.errors.some(replicaOutOfReach)) return true;
  // pg and pg-pool's own words for a connection that never came or was lost.
  return /timeout exceeded when trying to connect|Connection terminated|connection timeout|Client has encountered a connection error/i.test(
    error.message,
  );
}

function describe(error: unknown): string {
  if (!(error instanceof Error)) return String(error);
  const code = (error as { code?: unknown }).code;
  return [typeof code === "string" ? code : null, error.message || error.name].filter(Boolean).join(": ");
}
