import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { inviteSchema, projectParamsSchema } from "@/lib/schemas/member";
import { inviteMember } from "@/lib/server/invite-member";

export const POST = route(
  {
    params: projectParamsSchema,
    body: inviteSchema,
    access: ({ params }) => authorize("members.manage", params.projectId),
  },
  async ({ params, body, access }) => {
    const invitedBy = { id: access.user.id, name: access.user.name };
    const result = await inviteMember(db, { projectId: params.projectId, ...body, invitedBy });
    return NextResponse.json(result, { status: 201 });
  },
);
