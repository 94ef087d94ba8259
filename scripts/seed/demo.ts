import bcrypt from "bcryptjs";
import { fitCalibration } from "@/lib/elongation";
import { METRES_PER_FOOT, MM_PER_INCH } from "@/lib/units";
import { PREDICTION_BASIS_COLUMNS, predictTendon, projectBasisFromRow } from "@/lib/stressing/basis";
import { psiToMPa } from "@/lib/units";
import { DEMO_TIME_ZONE, demoDay, demoInstant } from "./demo-site";
import { seedDemoRecords } from "./demo-records";
import type { Kysely } from "kysely";
import type { Database, TendonSegment } from "@/db/types";
import type { Role, StressingEnds } from "@/lib/schemas/domain";

export { DEMO_TIME_ZONE, demoDay, demoInstant };

/**
 * The demo job: an invented four-level parking structure, "Alder Yard Parking", with
 * unbonded monostrand slab tendons, plus a second invented project so access rules can be
 * seen from both sides. Every name, address and value here is made up for the demo.
 *
 * Idempotent: rows are keyed on natural keys (e-mail, project code, pour name, lot number,
 * tendon tag) and inserted with ON CONFLICT DO NOTHING, so a second run changes nothing.
 */

export const DEMO_PASSWORD = "tautline-demo";

export const DEMO_PEOPLE: ReadonlyArray<{
  email: string;
  name: string;
  project: string;
  role: Role;
  operator?: boolean;
}> = [
  { email: "admin@demo.tautline.test", name: "Dana Okafor", project: "AYP", role: "admin", operator: true },
  { email: "crew@demo.tautline.test", name: "Luis Ferreira", project: "AYP", role: "crew" },
  { email: "inspector@demo.tautline.test", name: "Mei Lindqvist", project: "AYP", role: "inspector" },
  { email: "engineer@demo.tautline.test", name: "Priya Raman, P.E.", project: "AYP", role: "engineer" },
  { email: "crew@other.tautline.test", name: "Sam Whitcombe", project: "QHM", role: "crew" },
];

const IN = MM_PER_INCH;
const FT = 12 * IN;

/** Half-span parabolic segments: a drop h over a half span l turns the tendon by 2h/l. */
function drapedSpans(spans: number, spanMm: number, drapeMm: number): TendonSegment[] {
  const half = spanMm / 2;
  const angle = (2 * drapeMm) / half;
  return Array.from({ length: spans * 2 }, () => ({ lengthMm: half, angleRad: angle }));
}

interface DemoTendon {
  tag: string;
  segments: TendonSegment[];
  ends: StressingEnds;
  lot: string;
  /** The banded tendons form the column band, a member of its own; the uniform ones belong to the pour. */
  member: string | null;
}

/** One pour's slab tendons: uniform tendons one way, banded tendons over the column lines. */
function pourTendons(prefix: string, uniformCount: number, bandedCount: number): DemoTendon[] {
  const tendons: DemoTendon[] = [];
  for (let i = 1; i <= uniformCount; i++) {
    // Two 30 ft spans, and every fifth tendon runs a third span at the ramp.
    const spans = i % 5 === 0 ? 3 : 2;
    tendons.push({
      tag: `${prefix}-U${String(i).padStart(2, "0")}`,
      segments: drapedSpans(spans, 30 * FT, 4.25 * IN),
      ends: spans === 3 ? "both" : "A",
      lot: i % 3 === 0 ? "AY-0903" : "AY-0871",
      member: null,
    });
  }
  for (let i = 1; i <= bandedCount; i++) {
    tendons.push({
      tag: `${prefix}-B${String(i).padStart(2, "0")}`,
      segments: drapedSpans(4, 27.5 * FT, 5 * IN),
      ends: "both",
      lot: "AY-0871",
      member: "Column band",
    });
  }
  return tendons;
}

// Cylinder breaks (invented) confirmed on the first two pours; the third waits for its test.
// Dates are days from the first seeding: a week ago (stressed and released), today (being
// stressed), next week (planned).
export const DEMO_POURS = [
  { name: "L2 Pour 1", level: "Level 2", areaM2: 1480, dayOffset: -7, prefix: "2-1", concreteMpa: 23.4 },
  { name: "L2 Pour 2", level: "Level 2", areaM2: 1510, dayOffset: 0, prefix: "2-2", concreteMpa: 22.1 },
  { name: "L3 Pour 1", level: "Level 3", areaM2: 1495, dayOffset: 7, prefix: "3-1", concreteMpa: null },
] as const;

/**
 * Two invented jack-and-gauge sets with calibration points as a certificate would list them:
 * ten load steps, force read on a reference load cell (dates in days from the first seeding).
 * Set B's calibration runs out during the week of the demo, so the field log's expiry warning
 * can be seen; its gauge also reads low, so its tendons come out long (the drift to spot).
 */
const DEMO_EQUIPMENT = [
  {
    name: "Set A · Jack J-14",
    jack: "J-14-2207",
    gauge: "G-221",
    pump: "P-88",
    calibratedOn: -77,
    validUntil: 105,
    slope: 5162,
    intercept: -1150,
    wiggle: [310, -220, 140, -90, 260, -310, 80, 190, -160, 40],
  },
  {
    name: "Set B · Jack J-31",
    jack: "J-31-1865",
    gauge: "G-307",
    pump: "P-91",
    calibratedOn: -174,
    validUntil: 8,
    slope: 5231,
    intercept: -880,
    wiggle: [-150, 240, -60, 180, -270, 110, -40, 220, -130, 70],
  },
] as const;

function demoPoints(e: (typeof DEMO_EQUIPMENT)[number]) {
  return e.wiggle.map((w, i) => {
    const pressureMPa = 4 * (i + 1);
    return { pressureMPa, forceN: Math.round(e.slope * pressureMPa + e.intercept + w) };
  });
}

export interface SeedSummary {
  projects: number;
  users: number;
  pours: number;
  tendons: number;
}

/**
 * `records: true` adds the demo's stressing history (what `npm start` and the e2e run show);
 * tests that build their own records seed without it.
 */
export async function seedDemo(
  db: Kysely<Database>,
  options: { today?: Date; records?: boolean } = {},
): Promise<SeedSummary> {
  const today = options.today ?? new Date();
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);

  return db.transaction().execute(async (trx) => {
    await trx
      .insertInto("projects")
      .values([
        {
          code: "AYP",
          name: "Alder Yard Parking",
          address: "1400 Cinder Row (invented demo site)",
          unit_system: "us",
          reading_resolution: "1/8in",
          tolerance_pct: 7,
          comparison_basis: "net",
          count_jack_grip: false,
          friction_mu: 0.07,
          wobble_per_m: 0.0015 / METRES_PER_FOOT, // 0.0015 per ft, within ACI R18.6.2 greased monostrand range
          anchor_set_mm: 6.35,
          calibration_validity_days: 182,
          required_concrete_mpa: psiToMPa(3000), // exactly 3,000 psi, as the demo drawings state it
          engineer_of_record_name: "Priya Raman, P.E.",
          engineer_of_record_email: "engineer@demo.tautline.test",
          notify_emails: ["inspector@demo.tautline.test"],
          time_zone: DEMO_TIME_ZONE,
        },
        {
          code: "QHM",
          name: "Quarry Hill Clinic",
          address: "88 Slate Terrace (invented demo site)",
          unit_system: "si",
          reading_resolution: "1mm",
          time_zone: DEMO_TIME_ZONE,
        },
      ])
      .onConflict((oc) => oc.column("code").doNothing())
      .execute();

    await trx
      .insertInto("users")
      .values(
        DEMO_PEOPLE.map((p) => ({
          email: p.email,
          name: p.name,
          password_hash: passwordHash,
          email_verified: new Date(),
          is_operator: p.operator ?? false,
        })),
      )
      .onConflict((oc) => oc.column("email").doNothing())
      .execute();

    const projects = await trx
      .selectFrom("projects")
      .select(["id", "code"])
      .where("code", "in", ["AYP", "QHM"])
      .execute();
    const projectId = (code: string) => {
      const found = projects.find((p) => p.code === code);
      if (!found) throw new Error(`demo project ${code} missing after insert`);
      return found.id;
    };
    const users = await trx
      .selectFrom("users")
      .select(["id", "email"])
      .where(
        "email",
        "in",
        DEMO_PEOPLE.map((p) => p.email),
      )
      .execute();

    await trx
      .insertInto("project_members")
      .values(
        DEMO_PEOPLE.map((p) => {
          const user = users.find((u) => u.email === p.email);
          if (!user) throw new Error(`demo user ${p.email} missing after insert`);
          return { project_id: projectId(p.project), user_id: user.id, role: p.role };
        }),
      )
      .onConflict((oc) => oc.columns(["project_id", "user_id"]).doNothing())
      .execute();

    const ayp = projectId("AYP");
    await trx
      .insertInto("strand_lots")
      .values([
        // Invented mill-certificate values for the demo, near ASTM A416 nominal 0.5 in strand.
        {
          project_id: ayp,
          lot_number: "AY-0871",
          strand_size: "0.5 in",
          area_mm2: 99.3,
          modulus_mpa: 197_200,
          breaking_load_n: 187_400,
        },
        {
          project_id: ayp,
          lot_number: "AY-0903",
          strand_size: "0.5 in",
          area_mm2: 98.9,
          modulus_mpa: 195_600,
          breaking_load_n: 186_100,
        },
      ])
      .onConflict((oc) => oc.columns(["project_id", "lot_number"]).doNothing())
      .execute();
    const lots = await trx
      .selectFrom("strand_lots")
      .select(["id", "lot_number"])
      .where("project_id", "=", ayp)
      .execute();

    await trx
      .insertInto("pours")
      .values(
        DEMO_POURS.map((p) => ({
          project_id: ayp,
          name: p.name,
          level: p.level,
          area_m2: p.areaM2,
          planned_stressing_date: demoDay(today, p.dayOffset),
          concrete_strength_mpa: p.concreteMpa,
          // The lab result came in at 06:00 site time, before the crew started.
          concrete_confirmed_at: p.concreteMpa === null ? null : demoInstant(demoDay(today, p.dayOffset), 6 * 60),
        })),
      )
      .onConflict((oc) => oc.columns(["project_id", "name"]).doNothing())
      .execute();
    const pours = await trx.selectFrom("pours").select(["id", "name"]).where("project_id", "=", ayp).execute();

    // Shop-drawing elongations on every sixth uniform tendon, rounded to 1/8 in as a detailer
    // would; U18 and U30 of each pour differ from Tautline's prediction by about 3 %, so the
    // "check with the detailer" mark shows. Invented for the demo.
    const basis = await trx
      .selectFrom("projects")
      .select(PREDICTION_BASIS_COLUMNS)
      .where("id", "=", ayp)
      .executeTakeFirstOrThrow();
    const lotValues = await trx
      .selectFrom("strand_lots")
      .select(["lot_number", "area_mm2", "modulus_mpa", "breaking_load_n"])
      .where("project_id", "=", ayp)
      .execute();
    const SHOP_FACTORS: Record<number, number> = { 6: 1.004, 12: 0.992, 18: 1.031, 24: 1.006, 30: 0.968, 36: 0.997 };
    const shopElongation = (t: DemoTendon): number | null => {
      const factor = SHOP_FACTORS[Number(/-U(\d+)$/.exec(t.tag)?.[1] ?? 0)];
      if (!factor) return null;
      const lot = lotValues.find((l) => l.lot_number === t.lot);
      const predicted = predictTendon({
        project: projectBasisFromRow(basis),
        tendon: { strandSize: "0.5 in", strandCount: 1, segments: t.segments, ends: t.ends, jackGripMm: 18 * IN },
        lot: lot ? { areaMm2: lot.area_mm2, modulusMPa: lot.modulus_mpa, breakingLoadN: lot.breaking_load_n } : null,
      }).predictedMm;
      return (Math.round(((predicted * factor) / IN) * 8) / 8) * IN;
    };

    for (const demoPour of DEMO_POURS) {
      const pour = pours.find((p) => p.name === demoPour.name);
      if (!pour) throw new Error(`demo pour ${demoPour.name} missing after insert`);
      // A released pour's schedule is in already, and its trigger refuses even a row ON CONFLICT would skip.
      const state = await trx
        .selectFrom("pour_states")
        .select("status")
        .where("pour_id", "=", pour.id)
        .executeTakeFirst();
      if (state?.status === "released") continue;
      await trx
        .insertInto("tendons")
        .values(
          pourTendons(demoPour.prefix, 36, 14).map((t) => ({
            project_id: ayp,
            pour_id: pour.id,
            tag: t.tag,
            kind: "unbonded_monostrand" as const,
            strand_size: "0.5 in",
            strand_count: 1,
            segments: JSON.stringify(t.segments),
            ends: t.ends,
            jack_grip_mm: 18 * IN,
            shop_elongation_mm: shopElongation(t),
            strand_lot_id: lots.find((l) => l.lot_number === t.lot)?.id ?? null,
            member: t.member,
          })),
        )
        .onConflict((oc) => oc.columns(["pour_id", "tag"]).doNothing())
        .execute();
    }

    await trx
      .insertInto("equipment_sets")
      .values(
        DEMO_EQUIPMENT.map((e) => ({
          project_id: ayp,
          name: e.name,
          jack_serial: e.jack,
          gauge_serial: e.gauge,
          pump_serial: e.pump,
          jack_grip_mm: 18 * IN,
          max_force_n: 220_000,
        })),
      )
      .onConflict((oc) => oc.columns(["project_id", "name"]).doNothing())
      .execute();
    const sets = await trx.selectFrom("equipment_sets").select(["id", "name"]).where("project_id", "=", ayp).execute();
    for (const e of DEMO_EQUIPMENT) {
      const set = sets.find((x) => x.name === e.name);
      if (!set) throw new Error(`demo equipment set ${e.name} missing after insert`);
      const existing = await trx
        .selectFrom("calibrations")
        .select("id")
        .where("equipment_set_id", "=", set.id)
        .executeTakeFirst();
      if (existing) continue;
      const points = demoPoints(e);
      const fit = fitCalibration(points);
      await trx
        .insertInto("calibrations")
        .values({
          project_id: ayp,
          equipment_set_id: set.id,
          calibrated_on: demoDay(today, e.calibratedOn),
          valid_until: demoDay(today, e.validUntil),
          points: JSON.stringify(points),
          slope_n_per_mpa: fit.slope,
          intercept_n: fit.intercept,
          r2: fit.r2,
          min_pressure_mpa: Math.min(...points.map((p) => p.pressureMPa)),
          max_pressure_mpa: Math.max(...points.map((p) => p.pressureMPa)),
          laboratory: "Brightwater Load Lab (invented)",
        })
        .execute();
    }

    if (options.records)
      await seedDemoRecords(trx, { projectId: ayp, today, dayOf: (offset) => demoDay(today, offset) });

    const count = async (table: "projects" | "users" | "pours" | "tendons") =>
      Number(
        (
          await trx
            .selectFrom(table)
            .select((eb) => eb.fn.countAll<number>().as("n"))
            .executeTakeFirstOrThrow()
        ).n,
      );
    return {
      projects: await count("projects"),
      users: await count("users"),
      pours: await count("pours"),
      tendons: await count("tendons"),
    };
  });
}
