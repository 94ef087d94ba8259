/**
 * The guard every test that writes to PostgreSQL passes first: integration tests (through
 * `createTestDatabase`) and the e2e specs' own rows (`queryDemo` in tests/e2e/people.ts). Tests make
 * and change rows freely, so they refuse any database that is not on this machine's loopback.
 */
const LOOPBACK = new Set(["127.0.0.1", "localhost", "::1", "[::1]"]);

export function assertLocalDatabase(url: string | undefined, name = "the database URL"): void {
  if (!url)
    throw new Error(`${name} is not set: run the tests through \`npm test\`, which starts a throwaway PostgreSQL.`);
  let host: string;
  try {
    host = new URL(url).hostname;
  } catch {
    throw new Error(`${name} is not a URL, so the tests cannot tell where it points.`);
  }
  if (!LOOPBACK.has(host)) {
    throw new Error(`Refusing to run tests against a non-local database host: ${host} (${name})`);
  }
}
