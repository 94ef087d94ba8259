import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { changeRoleSchema, memberParamsSchema } from "@/lib/schemas/member";
import { changeMemberRole, removeMember } from "@/lib/server/change-member-role";

export const PATCH = route(
  {
    params: memberParamsSchema,
    body: changeRoleSchema,
    access: ({ params }) => authorize("members.manage", params.projectId),
  },
  async ({ params, body, access }) => {
    await changeMemberRole(db, { ...params, role: body.role, by: access.user.id });
    return { ok: true };
  },
);

export const DELETE = route(
  { params: memberParamsSchema, access: ({ params }) => authorize("members.manage", params.projectId) },
  async ({ params, access }) => {
    await removeMember(db, { ...params, by: access.user.id });
    return { ok: true };
  },
);
