import { execFile } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { promisify } from "node:util";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import { seedDemo } from "@/scripts/seed/demo";
import { createTestDatabase, type TestDatabase } from "../support/database";

const run = promisify(execFile);

// npm run db:backup / db:restore, end to end: the demo job with its stressing history is backed
// up, restored into a fresh database, and compared table by table (row counts) and record by
// record (a checksum over every column of records, flags, dispositions and audit rows).

let source: TestDatabase;
let target: TestDatabase;

beforeAll(async () => {
  source = await createTestDatabase({ migrate: true });
  await seedDemo(source.db, { records: true });
  target = await createTestDatabase();
});
afterAll(async () => {
  await source?.drop();
  await target?.drop();
});

const TABLES = [
  "records",
  "flags",
  "dispositions",
  "audit_events",
  "evaluations",
  "reviews",
  "notifications",
  "users",
  "tendons",
  "attachments",
];

async function fingerprint(db: Db) {
  const out: Record<string, { rows: number; md5: string }> = {};
  for (const table of TABLES) {
    const r = await sql<{ rows: number; md5: string }>`
      select count(*)::int as rows, coalesce(md5(string_agg(t::text, '|' order by t::text)), '') as md5
      from ${sql.table(table)} t`.execute(db);
    out[table] = r.rows[0]!;
  }
  return out;
}

describe("backup and restore", () => {
  it("a restored backup holds the same rows, checksum for checksum, and the app role's grants", async () => {
    const dir = join(mkdtempSync(join(tmpdir(), "backup-")), "b");
    // The upload store's files travel with the database: one file in, the same bytes out elsewhere.
    const [s3From, s3To] = [mkdtempSync(join(tmpdir(), "s3-")), mkdtempSync(join(tmpdir(), "s3-"))];
    mkdirSync(join(s3From, "tautline-uploads", "projects"), { recursive: true });
    writeFileSync(join(s3From, "tautline-uploads", "projects", "certificate.pdf"), "%PDF-1.4 evidence");
    await run("bash", ["scripts/db-backup.sh", dir], {
      env: { ...process.env, TAUTLINE_S3_DIR: s3From, MIGRATION_DATABASE_URL: source.url },
    });
    await run("bash", ["scripts/db-restore.sh", dir], {
      env: { ...process.env, TAUTLINE_S3_DIR: s3To, MIGRATION_DATABASE_URL: target.url },
    });
    expect(readFileSync(join(s3To, "tautline-uploads", "projects", "certificate.pdf"), "utf8")).toBe(
      "%PDF-1.4 evidence",
    );

    const [before, after] = [await fingerprint(source.db), await fingerprint(target.db)];
    expect(before.records!.rows).toBeGreaterThan(0);
    expect(before.flags!.rows).toBeGreaterThan(0);
    expect(after).toEqual(before);
    console.log(`backup/restore: ${TABLES.map((t) => `${t} ${after[t]!.rows}`).join(", ")}; checksums equal`);

    // The restored copy still refuses what the original refused.
    const err = await sql`truncate records cascade`.execute(target.db).then(
      () => null,
      (e: Error) => e.message,
    );
    expect(err).toMatch(/append-only/);
    const grants = await sql<{ n: number }>`
      select count(*)::int as n from information_schema.role_table_grants where grantee = 'tautline_app' and table_name = 'records'`.execute(
      target.db,
    );
    expect(grants.rows[0]!.n).toBeGreaterThan(0);
  });

  it("refuses to restore over a database that is not empty", async () => {
    const dir = join(mkdtempSync(join(tmpdir(), "backup-")), "b");
    await run("bash", ["scripts/db-backup.sh", dir], {
      env: { ...process.env, MIGRATION_DATABASE_URL: source.url, TAUTLINE_S3_DIR: mkdtempSync(join(tmpdir(), "s3-")) },
    });
    await expect(
      run("bash", ["scripts/db-restore.sh", dir], { env: { ...process.env, MIGRATION_DATABASE_URL: source.url } }),
    ).rejects.toThrow(/not empty/);
  });
});
