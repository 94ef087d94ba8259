import "server-only";
import type { Kysely } from "kysely";
import type { Db } from "@/db/connect";
import type { Database } from "@/db/types";
import type { Role } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { endSessions } from "./end-sessions";
import { recordAudit } from "./record-audit";

async function assertAnotherAdminRemains(db: Kysely<Database>, projectId: string, userId: string): Promise<void> {
  const others = await db
    .selectFrom("project_members")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("project_id", "=", projectId)
    .where("role", "=", "admin")
    .where("user_id", "!=", userId)
    .executeTakeFirstOrThrow();
  if (Number(others.n) === 0) {
    throw new AppError("CONFLICT", "A project needs at least one admin. Make someone else admin first.");
  }
}

/**
 * Locks one membership row for the rest of the transaction; a membership leaving the admin role
 * must leave another admin behind.
 */
async function lockMembership(
  trx: Kysely<Database>,
  input: { projectId: string; userId: string },
): Promise<{ role: Role }> {
  const current = await trx
    .selectFrom("project_members")
    .select("role")
    .where("project_id", "=", input.projectId)
    .where("user_id", "=", input.userId)
    .forUpdate()
    .executeTakeFirst();
  if (!current) throw new AppError("NOT_FOUND", "This person is not on the project.");
  return current;
}

export async function changeMemberRole(
  db: Db,
  input: { projectId: string; userId: string; role: Role; by: string },
): Promise<void> {
  await setMembership(db, input);
}

export async function removeMember(db: Db, input: { projectId: string; userId: string; by: string }): Promise<void> {
  await setMembership(db, { ...input, role: null });
}

/**
 * Gives a member another role, or (`role: null`) takes them off the project, under the membership's
 * row lock: the last admin stays, the person's sessions end and the act is audited. The same role
 * again changes nothing.
 */
async function setMembership(
  db: Db,
  input: { projectId: string; userId: string; role: Role | null; by: string },
): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const current = await lockMembership(trx, input);
    if (current.role === input.role) return;
    if (current.role === "admin") await assertAnotherAdminRemains(trx, input.projectId, input.userId);
    if (input.role === null)
      await trx
        .deleteFrom("project_members")
        .where("project_id", "=", input.projectId)
        .where("user_id", "=", input.userId)
        .execute();
    else
      await trx
        .updateTable("project_members")
        .set({ role: input.role })
        .where("project_id", "=", input.projectId)
        .where("user_id", "=", input.userId)
        .execute();
    await endSessions(trx, input.userId);
    await recordAudit(trx, {
      action: input.role === null ? "member.remove" : "member.role-change",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      target: input.userId,
      detail: input.role === null ? { role: current.role } : { from: current.role, to: input.role },
    });
  });
}
