import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { invitationParamsSchema } from "@/lib/schemas/member";
import { revokeInvitation } from "@/lib/server/revoke-invitation";

export const DELETE = route(
  { params: invitationParamsSchema, access: ({ params }) => authorize("members.manage", params.projectId) },
  async ({ params, access }) => {
    await revokeInvitation(db, { ...params, by: access.user.id });
    return { ok: true };
  },
);
