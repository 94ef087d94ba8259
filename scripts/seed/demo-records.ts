import type { Decision } from "@/lib/schemas/domain";
import { createHash } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { pressureForForce } from "@/lib/elongation";
import { addReview } from "@/lib/server/add-review";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { recordDisposition } from "@/lib/server/record-disposition";
import { releasePour } from "@/lib/server/release-pour";
import { predictTendon } from "@/lib/stressing/basis";
import { formatLength, MM_PER_INCH, MPA_PER_PSI, parseLength } from "@/lib/units";
import { DEMO_TIME_ZONE, demoInstant } from "./demo-site";

/**
 * The demo job's stressing, all invented: L2 Pour 1 was stressed a week ago, one tendon came out
 * long and was accepted, and the pour is released; L2 Pour 2 is being stressed today, with three
 * tendons out of band at different stages of review and a wire break; L3 Pour 1 is planned.
 * Set B's gauge reads low, so the tendons it stressed come out long by about 3 % (the drift the
 * insight page spots, small enough that the elongation and the gauge still agree on the force
 * within the band). Every record goes through the same evaluation as a synced one.
 */

const IN = MM_PER_INCH;
const PSI_PER_MPA = 1 / MPA_PER_PSI;

/** A stable UUID from a name, so a second seeding finds the rows of the first. */
export function demoUuid(name: string): string {
  const h = createHash("sha256").update(`tautline-demo:${name}`).digest("hex");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-8${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

const STEPPED = new Set(["2-1-B01", "2-1-B02", "2-1-B03", "2-1-B04", "2-1-B05", "2-1-B06"]);

/** Readings at 40, 70 and 100 % of the final pressure, on a line through a 3 mm slack offset. */
function gaugeSteps(line: { slope: number; intercept: number }, finalMPa: number, measuredMm: number) {
  const finalForce = line.slope * finalMPa + line.intercept;
  return [0.4, 0.7, 1].map((f) => {
    const pressureMPa = finalMPa * f;
    const force = line.slope * pressureMPa + line.intercept;
    return { pressureMPa, readingMm: 3 + (measuredMm * force) / finalForce };
  });
}

/** Deterministic scatter in [-1, 1) from a name. */
function scatter(name: string): number {
  const h = createHash("sha256").update(name).digest();
  return (h.readUInt32BE(0) / 2 ** 32) * 2 - 1;
}

interface Plan {
  tag: string;
  /** Deviation from the prediction before the set's drift, as a fraction. */
  deviation: number;
  wireBreakEnd?: "A" | "B";
}

const OUT_OF_BAND: Record<string, number> = {
  "2-1-U14": 0.089,
  "2-2-U08": -0.096,
  "2-2-U17": 0.104,
  "2-2-U23": -0.081,
};

function planFor(tags: string[]): Plan[] {
  return tags.map((tag) => ({
    tag,
    deviation: OUT_OF_BAND[tag] ?? 0.022 * scatter(tag),
    wireBreakEnd: tag === "2-2-B03" ? "B" : undefined,
  }));
}

export async function seedDemoRecords(
  trx: Kysely<Database>,
  input: { projectId: string; today: Date; dayOf: (offset: number) => string },
): Promise<number> {
  const already = await trx
    .selectFrom("records")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("device_id", "=", "demo-tablet-1")
    .limit(1)
    .executeTakeFirst();
  if (already) return 0;

  const person = (email: string) =>
    trx.selectFrom("users").select(["id", "name"]).where("email", "=", email).executeTakeFirstOrThrow();
  const crew = await person("crew@demo.tautline.test");
  const inspector = await person("inspector@demo.tautline.test");
  const engineer = await person("engineer@demo.tautline.test");
  const sets = await trx
    .selectFrom("equipment_sets")
    .innerJoin("calibrations", "calibrations.equipment_set_id", "equipment_sets.id")
    .select([
      "equipment_sets.id",
      "equipment_sets.name",
      "calibrations.id as calibrationId",
      "slope_n_per_mpa",
      "intercept_n",
    ])
    .where("equipment_sets.project_id", "=", input.projectId)
    .orderBy("equipment_sets.name")
    .execute();
  const [setA, setB] = sets;
  if (!setA || !setB) throw new Error("demo equipment sets missing");
  const pours = await trx
    .selectFrom("pours")
    .select(["id", "name"])
    .where("project_id", "=", input.projectId)
    .execute();
  const pourId = (name: string) => pours.find((p) => p.name === name)!.id;

  let count = 0;
  const stressPour = async (pourName: string, dayOffset: number, tags: string[]) => {
    const tendons = await trx
      .selectFrom("tendons")
      .select(["id", "tag", "ends"])
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", pourId(pourName))
      .where("tag", "in", tags)
      .orderBy("tag")
      .execute();
    let minute = 0;
    for (const plan of planFor(tags)) {
      const tendon = tendons.find((t) => t.tag === plan.tag);
      if (!tendon) continue;
      const basis = await loadTendonBasis(trx, { projectId: input.projectId, tendonId: tendon.id });
      const predicted = predictTendon({ project: basis.project, tendon: basis.tendon, lot: basis.lot });
      // Banded tendons were stressed with Set B, whose gauge reads low.
      const set = plan.tag.includes("-B") ? setB : setA;
      const drift = set === setB ? 0.027 : 0;
      const line = { slope: set.slope_n_per_mpa, intercept: set.intercept_n };
      // The crew pulls to the gauge mark and reads the dial to 50 psi, never past the mark.
      const psi = Math.floor((pressureForForce(line, predicted.jackingForceN) * PSI_PER_MPA) / 50) * 50;
      const ends = basis.tendon.ends === "both" ? (["A", "B"] as const) : [basis.tendon.ends];
      for (const end of ends) {
        const share = (predicted.prediction.perEndMm[end] ?? 0) / predicted.prediction.grossMm;
        const target = predicted.predictedMm * share * (1 + plan.deviation + drift);
        const before = 2 * IN;
        const afterText = formatLength(before + target, "1/8 in").replace(/ in$/, "");
        const measuredMm = parseLength(afterText, { field: "marksAfter", system: "US", defaultUnit: "in" }) - before;
        const id = demoUuid(`${plan.tag}:${end}`);
        // From 07:00 on the site's clock, one end every six minutes.
        const at = demoInstant(input.dayOf(dayOffset), 7 * 60).getTime() + minute++ * 6 * 60_000;
        await trx
          .insertInto("records")
          .values({
            id,
            project_id: input.projectId,
            pour_id: pourId(pourName),
            tendon_id: tendon.id,
            tendon_end: end,
            chain_id: id,
            revision: 1,
            equipment_set_id: set.id,
            calibration_id: set.calibrationId,
            final_pressure_mpa: psi / PSI_PER_MPA,
            reading_method: "marks",
            // Two-end tendons were pulled from both ends at once, so each end's reading is its share
            // to the meeting point (the shares above).
            stressing_order: basis.tendon.ends === "both" ? "simultaneous" : null,
            entered: JSON.stringify({
              units: { length: "in", pressure: "psi" },
              initialPressure: null,
              finalPressure: String(psi),
              marks: { before: "2", after: afterText },
              strokes: null,
              seating: null,
              // Last week's first banded tendons were also read at three gauge steps on the way up,
              // with a little slack taken up before the strand carried load.
              ...(STEPPED.has(plan.tag) ? { gaugeSteps: gaugeSteps(line, psi / PSI_PER_MPA, measuredMm) } : {}),
            }),
            measured_mm: measuredMm,
            wire_breaks: plan.wireBreakEnd === end ? 1 : 0,
            remarks: plan.wireBreakEnd === end ? "One wire heard to go at lock-off." : null,
            device_time: new Date(at),
            device_time_zone: DEMO_TIME_ZONE,
            device_id: "demo-tablet-1",
            author_user_id: crew.id,
            // In signal at the slab edge: the record reaches the server within minutes of its save.
            received_at: new Date(at + 3 * 60_000),
          })
          .execute();
        count++;
      }
      await evaluateTendon(trx, { projectId: input.projectId, tendonId: tendon.id, reason: "sync" });
    }
  };

  const tags = (prefix: string, uniform: number, banded: number) => [
    ...Array.from({ length: uniform }, (_, i) => `${prefix}-U${String(i + 1).padStart(2, "0")}`),
    ...Array.from({ length: banded }, (_, i) => `${prefix}-B${String(i + 1).padStart(2, "0")}`),
  ];
  await stressPour("L2 Pour 1", -7, tags("2-1", 36, 14));
  await stressPour("L2 Pour 2", 0, tags("2-2", 30, 6));

  const flagOf = async (tag: string, kind = "out_of_band") =>
    trx
      .selectFrom("flags")
      .innerJoin("tendons", "tendons.id", "flags.tendon_id")
      .select("flags.id")
      .where("flags.project_id", "=", input.projectId)
      .where("tendons.tag", "=", tag)
      .where("flags.kind", "=", kind as never)
      .executeTakeFirstOrThrow();
  const licence = "Licensed professional engineer, demo licence PE-00000, invented";
  // The inspector sends a flag on to the engineer, who decides with the instruction in words.
  const referAndDecide = async (flagId: string, sentWith: string, decision: Decision, reasons: string) => {
    await addReview(trx, {
      projectId: input.projectId,
      flagId,
      author: inspector,
      review: { kind: "sent_to_engineer", body: sentWith },
    });
    await recordDisposition(trx, {
      projectId: input.projectId,
      flagId,
      engineer,
      disposition: { decision, reasons, licenceStatement: licence },
    });
  };

  // Last week's long tendon: checked, lifted off, accepted; then the pour was released.
  const u14 = await flagOf("2-1-U14");
  await addReview(trx, {
    projectId: input.projectId,
    flagId: u14.id,
    author: inspector,
    review: {
      kind: "remeasured",
      body: "Re-measured the tail mark with a steel tape; the reading stands.",
      remeasuredMm: await recordMm(trx, "2-1-U14"),
    },
  });
  await referAndDecide(
    u14.id,
    "Long by about 9 %; wedges and dead end look normal.",
    "accept",
    "Lift-off at the live end matched the gauge within 2 %; friction lower than assumed on this run. Accepted as stressed.",
  );
  await releasePour(trx, {
    projectId: input.projectId,
    pourId: pourId("L2 Pour 1"),
    by: { ...engineer, role: "engineer" },
    statement: "All tendons of L2 Pour 1 are stressed and accepted; tails may be cut.",
    signerName: engineer.name,
    // The release asks for the licence number itself; the statement goes with each disposition.
    licence: "PE-00000 (invented demo licence)",
  });

  // Today: one long tendon ordered restressed, one short waiting on a lift-off check, one short
  // just flagged, and the wire break still open.
  const u17 = await flagOf("2-2-U17");
  await referAndDecide(
    u17.id,
    "Long by about 10 %; the crew thinks the dead end slipped.",
    "restress",
    "Possible dead-end slip. Restress to the same gauge pressure and re-read the mark before the tails are cut.",
  );
  const u23 = await flagOf("2-2-U23");
  await referAndDecide(
    u23.id,
    "Short by about 8 %; sheathing looked damaged near the second high point.",
    "liftoff_check",
    "Check the force by lift-off at the live end before deciding; report the lift-off pressure.",
  );
  return count;
}

async function recordMm(trx: Kysely<Database>, tag: string): Promise<number> {
  const r = await trx
    .selectFrom("records")
    .innerJoin("tendons", "tendons.id", "records.tendon_id")
    .select("records.measured_mm")
    .where("tendons.tag", "=", tag)
    .executeTakeFirstOrThrow();
  return r.measured_mm;
}
