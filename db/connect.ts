import { createHash } from "node:crypto";
import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "./types";

// PostgreSQL returns BIGINT (count(*)) and NUMERIC as strings; Tautline's counts fit in a JS number.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));
// DATE columns stay as ISO strings ("2026-12-01"): a calendar day, not an instant.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);

/** Most named statements one connection keeps; texts past that run unnamed. */
export const PREPARED_PER_CONNECTION = 200;

const names = new Map<string, string>();

/** The statement name of a query text: a hash of it, remembered for the texts seen most. */
function statementName(text: string): string {
  let name = names.get(text);
  if (!name) {
    name = `tl_${createHash("sha1").update(text).digest("base64url").slice(0, 24)}`;
    if (names.size >= 4 * PREPARED_PER_CONNECTION) names.clear();
    names.set(text, name);
  }
  return name;
}

/**
 * A client that sends parameterised queries as named prepared statements (named by a hash of
 * their text), so PostgreSQL parses and plans each query shape once per connection rather than
 * on every call: the sync push runs the same few statements for every record. pg keeps the
 * names it has prepared on the connection; this keeps their count bounded.
 */
export class PreparingClient extends pg.Client {
  constructor(config?: string | pg.ClientConfig) {
    super(config);
    const prepared = new Set<string>();
    const query = super.query.bind(this) as (...args: unknown[]) => unknown;
    // pg's query() has many forms; only the (text, values) one Kysely uses is sent named.
    this.query = ((...args: unknown[]) => {
      const [text, values, ...rest] = args;
      if (typeof text === "string" && Array.isArray(values) && values.length > 0 && rest.length === 0) {
        const name = statementName(text);
        if (prepared.has(name) || prepared.size < PREPARED_PER_CONNECTION) {
          prepared.add(name);
          return query({ name, text, values });
        }
      }
      return query(...args);
    }) as pg.Client["query"];
  }
}

/**
 * Opens a Kysely instance on a connection string. The app uses the one in `db/index.ts`, with
 * `prepare` on; scripts and tests that change the schema keep it off, since a statement
 * prepared before a schema change can no longer run after it.
 */
export function createDb(
  connectionString: string,
  max = 10,
  options: {
    prepare?: boolean;
    /** Give up opening a connection after this long (default: wait). */ connectTimeoutMs?: number;
  } = {},
): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString,
    max,
    idleTimeoutMillis: 30_000,
    ...(options.connectTimeoutMs ? { connectionTimeoutMillis: options.connectTimeoutMs } : {}),
    ...(options.prepare ? { Client: PreparingClient } : {}),
  });
  // An idle connection that PostgreSQL drops (a restart, a network cut, an administrator ending
  // the session) makes the pool emit "error"; with no listener node ends the whole process. The
  // pool has already discarded that client, and the next query opens a new connection.
  pool.on("error", (error) => {
    console.error(
      `${new Date().toISOString()} database connection lost (the pool reconnects on the next query): ${error.message}`,
    );
  });
  // The pool listens only while a client is idle. A connection lost while a request holds it (in a
  // transaction, between two queries) makes that client emit "error" with nobody listening, which
  // would end the app in the middle of serving everyone else. The holder's next query fails and its
  // transaction is rolled back by PostgreSQL; the pool discards the broken client on release.
  pool.on("connect", (client) => {
    client.on("error", (error) => {
      console.error(`${new Date().toISOString()} database connection lost during a request: ${error.message}`);
    });
  });
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

export type Db = Kysely<Database>;
