import "server-only";
import pg from "pg";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import { env } from "@/lib/env";

/**
 * Failed sign-in counters, kept in PostgreSQL (table rate_limits) so they hold across server
 * processes and restarts. Per account: 10 failures in 15 minutes pauses that account; per
 * address: 50 failures in an hour pauses that address (well inside OWASP ASVS's ~100/hour).
 */

let pool: pg.Pool | undefined;
let limiters: { account: RateLimiterPostgres; address: RateLimiterPostgres } | undefined;

function get() {
  if (!pool) {
    pool = new pg.Pool({ connectionString: env.RATE_LIMIT_DATABASE_URL ?? env.DATABASE_URL, max: 2 });
    pool.on("error", (error) => console.error(`rate-limit pool: connection lost (${error.message})`));
  }
  limiters ??= {
    account: new RateLimiterPostgres({
      storeClient: pool,
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: "signin-account",
      points: 10,
      duration: 15 * 60,
    }),
    address: new RateLimiterPostgres({
      storeClient: pool,
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: "signin-address",
      points: 50,
      duration: 60 * 60,
    }),
  };
  return limiters;
}

const remaining = async (limiter: RateLimiterPostgres, key: string) => {
  const res = await limiter.get(key);
  return res ? limiter.points - res.consumedPoints : limiter.points;
};

/**
 * True when this account or address has used up its failed attempts. An unknown address (no
 * trusted proxy, lib/http/client-address.ts) is counted per account only, never in a bucket
 * shared by everyone whose address is unknown.
 */
export async function isSignInPaused(email: string, ip: string | null): Promise<boolean> {
  const { account, address } = get();
  const [a, b] = await Promise.all([remaining(account, email), ip ? remaining(address, ip) : address.points]);
  return a <= 0 || b <= 0;
}

export async function countFailedSignIn(email: string, ip: string | null): Promise<void> {
  const { account, address } = get();
  await Promise.all(
    [account.consume(email), ...(ip ? [address.consume(ip)] : [])].map((p) =>
      p.catch((e: unknown) => {
        if (!(e instanceof RateLimiterRes)) throw e;
      }),
    ),
  );
}

export async function clearFailedSignIns(email: string): Promise<void> {
  await get().account.delete(email);
}
