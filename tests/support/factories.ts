import type { Db } from "@/db/connect";
import type { TendonSegment } from "@/db/types";
import type { StressingEnds } from "@/lib/schemas/domain";
import type { TendonInput } from "@/lib/schemas/tendon";

/**
 * Rows an integration test makes for itself, so it does not lean on what the demo seed or another
 * test left behind. Each factory inserts one thing with plain defaults (an invented scenario of
 * our own) and returns its id; pass only what the test is about. Names carry a counter so two
 * calls never collide on a natural key.
 */

let counter = 0;
const next = () => ++counter;

export async function makeProject(
  db: Db,
  values: { code?: string; name?: string; timeZone?: string } = {},
): Promise<{ id: string }> {
  const n = next();
  return db
    .insertInto("projects")
    .values({
      code: values.code ?? `TF-${n}`,
      name: values.name ?? `Factory project ${n}`,
      ...(values.timeZone ? { time_zone: values.timeZone } : {}),
    })
    .returning("id")
    .executeTakeFirstOrThrow();
}

export async function makePour(
  db: Db,
  projectId: string,
  values: { name?: string; concreteStrengthMPa?: number | null } = {},
): Promise<{ id: string }> {
  return db
    .insertInto("pours")
    .values({
      project_id: projectId,
      name: values.name ?? `Factory pour ${next()}`,
      concrete_strength_mpa: values.concreteStrengthMPa ?? null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
}

/** A strand lot: by default a 0.5 in seven-wire lot near the ASTM A416 nominal 98.71 mm² and 196.5 GPa. */
export async function makeStrandLot(
  db: Db,
  projectId: string,
  values: Partial<{
    lotNumber: string;
    strandSize: string;
    areaMm2: number;
    modulusMPa: number;
    breakingLoadN: number;
  }> = {},
): Promise<{ id: string }> {
  return db
    .insertInto("strand_lots")
    .values({
      project_id: projectId,
      lot_number: values.lotNumber ?? `TF-LOT-${next()}`,
      strand_size: values.strandSize ?? "0.5 in",
      area_mm2: values.areaMm2 ?? 98.7,
      modulus_mpa: values.modulusMPa ?? 196_500,
      breaking_load_n: values.breakingLoadN ?? 186_000,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
}

export interface TendonShape {
  kind: TendonInput["kind"];
  strandSize: string;
  strandCount: number;
  segments: TendonSegment[];
  ends: StressingEnds;
  jackGripMm: number | null;
  shopElongationMm?: number | null;
  strandLotId?: string | null;
  /** The member (beam, slab strip, band) the schedule puts the tendon in; none: the pour is its group. */
  member?: string | null;
}

/** Tendons of one shape in a pour, tagged as given; returned in the same order. */
export async function makeTendons(
  db: Db,
  where: { projectId: string; pourId: string },
  tags: readonly string[],
  shape: TendonShape,
): Promise<{ id: string; pour_id: string; tag: string }[]> {
  const rows = [];
  for (const tag of tags) {
    rows.push(
      await db
        .insertInto("tendons")
        .values({
          project_id: where.projectId,
          pour_id: where.pourId,
          tag,
          kind: shape.kind,
          strand_size: shape.strandSize,
          strand_count: shape.strandCount,
          segments: JSON.stringify(shape.segments),
          ends: shape.ends,
          jack_grip_mm: shape.jackGripMm,
          shop_elongation_mm: shape.shopElongationMm ?? null,
          strand_lot_id: shape.strandLotId ?? null,
          ...(shape.member !== undefined && { member: shape.member }),
        })
        .returning(["id", "pour_id", "tag"])
        .executeTakeFirstOrThrow(),
    );
  }
  return rows;
}
