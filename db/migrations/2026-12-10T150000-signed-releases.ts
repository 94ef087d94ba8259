import { sql, type Kysely } from "kysely";

// Frozen. The engineer signs a pour's release: the name typed as signed, the licence number, and
// the sha256 of the pour's stressing report as it stood at signing (the same content hash the
// report's signature uses). Releases signed before this have none (null). `releases` stays
// append-only; the signing time is its `created_at`.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("releases")
    .addColumn("signer_name", "text")
    .addColumn("licence", "text")
    .addColumn("content_sha256", "text", (c) => c.check(sql`content_sha256 ~ '^[0-9a-f]{64}$'`))
    .execute();
  await sql`
    alter table releases add constraint releases_signature_complete check (
      (signer_name is null and licence is null and content_sha256 is null)
      or (signer_name is not null and licence is not null and content_sha256 is not null)
    )
  `.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table releases drop constraint if exists releases_signature_complete`.execute(db);
  await db.schema
    .alterTable("releases")
    .dropColumn("signer_name")
    .dropColumn("licence")
    .dropColumn("content_sha256")
    .execute();
}
