import { sql, type Kysely } from "kysely";

// An equipment set carries the wedge draw-in its jack loses at each re-grip between strokes. A
// ram-travel record that types no draw-in of its own is judged with the set's value.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("equipment_sets")
    .addColumn("draw_in_mm", "double precision", (c) =>
      c.check(sql`draw_in_mm is null or (draw_in_mm >= 0 and draw_in_mm <= 49)`),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("equipment_sets").dropColumn("draw_in_mm").execute();
}
