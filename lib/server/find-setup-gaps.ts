import "server-only";
import type { Db } from "@/db/connect";
import { listEquipmentSets } from "./list-equipment-sets";

export interface SetupGap {
  what: string;
  /** Where on the project's setup the admin fixes it. */
  href: string;
}

/** What is still missing before a crew can go out on the project, in plain words. */
export async function findSetupGaps(
  db: Db,
  projectId: string,
  today?: string,
): Promise<{ gaps: SetupGap[]; counts: { pours: number; tendons: number; lots: number; sets: number } }> {
  const base = `/projects/${projectId}`;
  const [project, pours, tendons, lots, sets, noLot, emptyPours] = await Promise.all([
    db
      .selectFrom("projects")
      .select(["engineer_of_record_email", "required_concrete_mpa"])
      .where("id", "=", projectId)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("pours")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .where("project_id", "=", projectId)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("tendons")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .where("project_id", "=", projectId)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("strand_lots")
      .select(["id", "certificate_attachment_id"])
      .where("project_id", "=", projectId)
      .execute(),
    listEquipmentSets(db, projectId, today),
    db
      .selectFrom("tendons")
      .select((eb) => eb.fn.countAll<number>().as("n"))
      .where("project_id", "=", projectId)
      .where("strand_lot_id", "is", null)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("pours")
      .select("name")
      .where("project_id", "=", projectId)
      .where((eb) =>
        eb.not(
          eb.exists(
            eb
              .selectFrom("tendons")
              .select("tendons.id")
              .whereRef("tendons.pour_id", "=", "pours.id")
              .where("tendons.project_id", "=", projectId),
          ),
        ),
      )
      .execute(),
  ]);
  const gaps: SetupGap[] = [];
  if (!project.engineer_of_record_email)
    gaps.push({ what: "No engineer of record e-mail: flags would reach nobody.", href: `${base}/setup` });
  if (project.required_concrete_mpa === null)
    gaps.push({ what: "No required concrete strength before stressing.", href: `${base}/setup` });
  if (Number(pours.n) === 0) gaps.push({ what: "No pours yet.", href: `${base}/pours` });
  for (const p of emptyPours)
    gaps.push({ what: `${p.name} has no tendons: import its schedule.`, href: `${base}/pours` });
  if (Number(noLot.n) > 0)
    gaps.push({
      what: `${noLot.n} tendon${Number(noLot.n) === 1 ? " has" : "s have"} no strand lot (computed on nominal values).`,
      href: `${base}/pours`,
    });
  if (lots.length === 0) gaps.push({ what: "No strand lots with mill certificates.", href: `${base}/strand-lots` });
  const noCert = lots.filter((l) => !l.certificate_attachment_id).length;
  if (noCert)
    gaps.push({
      what: `${noCert} strand lot${noCert === 1 ? " has" : "s have"} no mill certificate file.`,
      href: `${base}/strand-lots`,
    });
  if (sets.length === 0) gaps.push({ what: "No equipment sets.", href: `${base}/equipment` });
  for (const s of sets) {
    if (s.state === "none") gaps.push({ what: `${s.name} has no calibration.`, href: `${base}/equipment` });
    if (s.state === "expired")
      gaps.push({ what: `${s.name}: calibration expired on ${s.current?.validUntil}.`, href: `${base}/equipment` });
    if (s.state === "expiring")
      gaps.push({ what: `${s.name}: calibration runs out on ${s.current?.validUntil}.`, href: `${base}/equipment` });
  }
  return { gaps, counts: { pours: Number(pours.n), tendons: Number(tendons.n), lots: lots.length, sets: sets.length } };
}
