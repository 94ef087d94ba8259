import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import { inviteMember } from "./invite-member";
import { recordAudit } from "./record-audit";

/**
 * A site operator creates a project and invites its first admin (or makes an existing
 * person admin at once).
 */
export async function createProject(
  db: Db,
  input: {
    code: string;
    name: string;
    unitSystem: "us" | "si";
    firstAdminEmail: string;
    by: { id: string; name: string };
  },
): Promise<{ projectId: string; invited: boolean }> {
  const result = await db.transaction().execute(async (trx) => {
    const exists = await trx.selectFrom("projects").select("id").where("code", "=", input.code).executeTakeFirst();
    if (exists)
      throw new AppError("CONFLICT", `The project code ${input.code} is taken.`, {
        code: ["Already used by another project."],
      });
    const project = await trx
      .insertInto("projects")
      .values({
        code: input.code,
        name: input.name,
        unit_system: input.unitSystem,
        reading_resolution: input.unitSystem === "us" ? "1/8in" : "1mm",
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const admin = await trx
      .selectFrom("users")
      .select("id")
      .where("email", "=", input.firstAdminEmail)
      .where("is_active", "=", true)
      .executeTakeFirst();
    if (admin) {
      await trx
        .insertInto("project_members")
        .values({ project_id: project.id, user_id: admin.id, role: "admin" })
        .execute();
    }
    await recordAudit(trx, {
      action: "project.create",
      outcome: "success",
      actorUserId: input.by.id,
      projectId: project.id,
      target: input.firstAdminEmail,
    });
    return { projectId: project.id, adminExists: Boolean(admin) };
  });
  if (!result.adminExists) {
    await inviteMember(db, {
      projectId: result.projectId,
      email: input.firstAdminEmail,
      role: "admin",
      invitedBy: input.by,
    });
  }
  return { projectId: result.projectId, invited: !result.adminExists };
}
