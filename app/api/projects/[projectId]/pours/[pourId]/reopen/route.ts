import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { releaseParamsSchema, reopenSchema } from "@/lib/schemas/review";
import { reopenPour } from "@/lib/server/reopen-pour";

export const POST = route(
  {
    params: releaseParamsSchema,
    body: reopenSchema,
    access: ({ params }) => authorize("pour.reopen", params.projectId),
  },
  async ({ params, body, access }) => {
    const by = { id: access.user.id, name: access.user.name, role: access.role };
    const result = await reopenPour(db, { ...params, by, reason: body.reason });
    return NextResponse.json(result, { status: 201 });
  },
);
