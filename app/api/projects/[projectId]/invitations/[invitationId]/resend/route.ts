import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { invitationParamsSchema } from "@/lib/schemas/member";
import { resendInvitation } from "@/lib/server/resend-invitation";

export const POST = route(
  { params: invitationParamsSchema, access: ({ params }) => authorize("members.manage", params.projectId) },
  async ({ params, access }) => {
    await resendInvitation(db, { ...params, by: { id: access.user.id, name: access.user.name } });
    return { ok: true };
  },
);
