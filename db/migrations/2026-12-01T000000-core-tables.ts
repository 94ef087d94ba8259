import { sql, type Kysely } from "kysely";

// Frozen: never edit a migration that has shipped; add a new one instead.
// Core tables: people, projects and who does what on them, pours, strand lots and tendons.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("users")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("password_hash", "text")
    .addColumn("email_verified", "timestamptz")
    .addColumn("is_operator", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("is_active", "boolean", (c) => c.notNull().defaultTo(true))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("users_email_lower", sql`email = lower(email)`)
    .execute();
  await db.schema.createIndex("users_email_key").unique().on("users").column("email").execute();

  await db.schema
    .createTable("projects")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("code", "text", (c) => c.notNull().unique())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("address", "text")
    .addColumn("unit_system", "text", (c) =>
      c
        .notNull()
        .defaultTo("us")
        .check(sql`unit_system in ('us', 'si')`),
    )
    .addColumn("reading_resolution", "text", (c) =>
      c
        .notNull()
        .defaultTo("1/8in")
        .check(sql`reading_resolution in ('1/8in', '1/16in', '1mm')`),
    )
    .addColumn("tolerance_pct", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(7)
        .check(sql`tolerance_pct > 0 and tolerance_pct <= 25`),
    )
    .addColumn("group_tolerance_pct", "double precision", (c) =>
      c.check(sql`group_tolerance_pct > 0 and group_tolerance_pct <= 25`),
    )
    .addColumn("short_tendon_floor_mm", "double precision", (c) => c.check(sql`short_tendon_floor_mm > 0`))
    .addColumn("comparison_basis", "text", (c) =>
      c
        .notNull()
        .defaultTo("gross")
        .check(sql`comparison_basis in ('gross', 'net')`),
    )
    .addColumn("count_jack_grip", "boolean", (c) => c.notNull().defaultTo(true))
    .addColumn("friction_mu", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(0.07)
        .check(sql`friction_mu >= 0 and friction_mu < 1`),
    )
    .addColumn("wobble_per_m", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(0.0033)
        .check(sql`wobble_per_m >= 0 and wobble_per_m < 0.1`),
    )
    .addColumn("anchor_set_mm", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(6)
        .check(sql`anchor_set_mm >= 0 and anchor_set_mm < 50`),
    )
    .addColumn("calibration_validity_days", "integer", (c) =>
      c
        .notNull()
        .defaultTo(182)
        .check(sql`calibration_validity_days between 1 and 1096`),
    )
    .addColumn("required_concrete_mpa", "double precision", (c) => c.check(sql`required_concrete_mpa > 0`))
    .addColumn("engineer_of_record_name", "text")
    .addColumn("engineer_of_record_email", "text")
    .addColumn("notify_emails", sql`text[]`, (c) => c.notNull().defaultTo(sql`'{}'::text[]`))
    .addColumn("blind_entry", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("project_members")
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('crew', 'inspector', 'engineer', 'admin')`))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("project_members_pkey", ["project_id", "user_id"])
    .execute();
  await db.schema.createIndex("project_members_user_idx").on("project_members").column("user_id").execute();

  await db.schema
    .createTable("pours")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("level", "text")
    .addColumn("area_m2", "double precision", (c) => c.check(sql`area_m2 > 0`))
    .addColumn("planned_stressing_date", "date")
    .addColumn("status", "text", (c) =>
      c
        .notNull()
        .defaultTo("planned")
        .check(sql`status in ('planned', 'stressing', 'released')`),
    )
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("pours_project_name_key", ["project_id", "name"])
    .execute();

  await db.schema
    .createTable("strand_lots")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("lot_number", "text", (c) => c.notNull())
    .addColumn("strand_size", "text", (c) => c.notNull())
    .addColumn("area_mm2", "double precision", (c) => c.notNull().check(sql`area_mm2 > 0`))
    .addColumn("modulus_mpa", "double precision", (c) => c.notNull().check(sql`modulus_mpa > 0`))
    .addColumn("breaking_load_n", "double precision", (c) => c.notNull().check(sql`breaking_load_n > 0`))
    .addColumn("certificate_attachment_id", "uuid")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("strand_lots_project_lot_key", ["project_id", "lot_number"])
    .execute();

  await db.schema
    .createTable("tendons")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tag", "text", (c) => c.notNull())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('unbonded_monostrand', 'bonded_multistrand')`))
    .addColumn("strand_size", "text", (c) => c.notNull())
    .addColumn("strand_count", "integer", (c) => c.notNull().check(sql`strand_count between 1 and 61`))
    .addColumn("segments", "jsonb", (c) =>
      c.notNull().check(sql`jsonb_typeof(segments) = 'array' and jsonb_array_length(segments) > 0`),
    )
    .addColumn("ends", "text", (c) => c.notNull().check(sql`ends in ('A', 'B', 'both')`))
    .addColumn("jack_grip_mm", "double precision", (c) => c.check(sql`jack_grip_mm >= 0`))
    .addColumn("shop_elongation_mm", "double precision", (c) => c.check(sql`shop_elongation_mm > 0`))
    .addColumn("strand_lot_id", "uuid", (c) => c.references("strand_lots.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("tendons_pour_tag_key", ["pour_id", "tag"])
    .execute();
  await db.schema.createIndex("tendons_project_idx").on("tendons").column("project_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ["tendons", "strand_lots", "pours", "project_members", "projects", "users"]) {
    await db.schema.dropTable(table).execute();
  }
}
