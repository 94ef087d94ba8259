import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { projectTimeZone } from "@/lib/format/dates";
import type { FlagMailMode } from "@/lib/schemas/domain";
import { nextShiftEnd } from "@/lib/stressing/shift";

/** A member's flag e-mail choice on a project, with the project's shift ends and the next one. */
export async function getFlagMail(
  db: Kysely<Database>,
  input: { projectId: string; userId: string; now?: Date },
): Promise<{
  mode: FlagMailMode;
  digestFrom: Date | null;
  timeZone: string;
  shiftEnds: number[];
  nextEnd: Date;
  /** Whether the project's settings list the member's address for flag e-mails. */
  listed: boolean;
}> {
  const row = await db
    .selectFrom("project_members")
    .innerJoin("projects", "projects.id", "project_members.project_id")
    .innerJoin("users", "users.id", "project_members.user_id")
    .select([
      "users.email",
      "projects.engineer_of_record_email",
      "projects.notify_emails",
      "project_members.flag_mail",
      "project_members.digest_from",
      "projects.time_zone",
      "projects.shift_end_minutes",
    ])
    .where("project_members.project_id", "=", input.projectId)
    .where("project_members.user_id", "=", input.userId)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "You are not on this project.");
  const timeZone = projectTimeZone(row);
  return {
    mode: row.flag_mail,
    digestFrom: row.digest_from,
    timeZone,
    shiftEnds: row.shift_end_minutes,
    nextEnd: nextShiftEnd(input.now ?? new Date(), timeZone, row.shift_end_minutes),
    listed: [row.engineer_of_record_email, ...row.notify_emails].some(
      (e) => e?.toLowerCase() === row.email.toLowerCase(),
    ),
  };
}
