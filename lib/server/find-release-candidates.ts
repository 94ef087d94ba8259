import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { PourStatus } from "@/lib/schemas/domain";
import { projectTimeZone } from "@/lib/format/dates";
import { findReleaseBlockers, type ReleaseBlockers } from "./release-pour";

export interface ReleaseCandidate {
  projectId: string;
  projectName: string;
  pourId: string;
  pourName: string;
  /** Who releases this project's pours (the project's rule). */
  releaseBy: "engineer" | "inspector";
  /** The project's time zone: the release and reopening times are shown in it. */
  timeZone: string;
  tendonCount: number;
  blockers: ReleaseBlockers;
  /** Derived: planned, stressing, stressed or released. */
  status: PourStatus;
  releasedBy: string | null;
  releasedAt: Date | null;
  releaseStatement: string | null;
  /** The standing release's signature: typed name, licence, and the report's sha256 at signing. */
  releaseSignature: { signerName: string; licence: string; contentSha256: string } | null;
  /** The last reopening of a release, shown with the pour. */
  reopened: { by: string; at: Date; reason: string } | null;
}

/** The pours of the given projects with what still blocks each one's release. */
export async function findReleaseCandidates(db: Kysely<Database>, projectIds: string[]): Promise<ReleaseCandidate[]> {
  if (!projectIds.length) return [];
  const pours = await db
    .selectFrom("pours")
    .innerJoin("projects", "projects.id", "pours.project_id")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .leftJoin("releases", "releases.id", "pour_states.release_id")
    .select([
      "pours.id",
      "pours.name",
      "pours.project_id",
      "projects.name as projectName",
      "projects.release_by",
      "projects.time_zone",
      "pour_states.status",
      "pour_states.released_by_name",
      "pour_states.released_at as releasedAt",
      "pour_states.release_statement",
      "releases.signer_name",
      "releases.licence",
      "releases.content_sha256",
      "pour_states.last_reopened_by_name",
      "pour_states.last_reopened_at",
      "pour_states.last_reopen_reason",
      (eb) =>
        eb
          .selectFrom("tendons")
          .select((e) => e.fn.countAll<number>().as("n"))
          .whereRef("tendons.pour_id", "=", "pours.id")
          .as("tendonCount"),
    ])
    .where("pours.project_id", "in", projectIds)
    .orderBy("projects.name")
    .orderBy("pours.planned_stressing_date")
    .orderBy("pours.name")
    .execute();
  return Promise.all(
    pours.map(async (p) => ({
      projectId: p.project_id,
      projectName: p.projectName,
      pourId: p.id,
      pourName: p.name,
      releaseBy: p.release_by,
      timeZone: projectTimeZone(p),
      tendonCount: Number(p.tendonCount ?? 0),
      blockers: p.released_by_name
        ? { noSchedule: false, openFlags: [], unstressed: [] }
        : await findReleaseBlockers(db, { projectId: p.project_id, pourId: p.id }),
      status: p.status,
      releasedBy: p.released_by_name,
      releasedAt: p.releasedAt,
      releaseStatement: p.release_statement,
      releaseSignature:
        p.signer_name && p.licence && p.content_sha256
          ? { signerName: p.signer_name, licence: p.licence, contentSha256: p.content_sha256 }
          : null,
      reopened:
        p.last_reopened_by_name && p.last_reopened_at
          ? { by: p.last_reopened_by_name, at: p.last_reopened_at, reason: p.last_reopen_reason ?? "" }
          : null,
    })),
  );
}
