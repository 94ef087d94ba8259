import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { releaseParamsSchema, releaseSchema } from "@/lib/schemas/review";
import { releasePour } from "@/lib/server/release-pour";

export const POST = route(
  {
    params: releaseParamsSchema,
    body: releaseSchema,
    access: ({ params }) => authorize("pour.release", params.projectId),
  },
  async ({ params, body, access }) => {
    const by = { id: access.user.id, name: access.user.name, role: access.role };
    const result = await releasePour(db, {
      ...params,
      by,
      statement: body.statement,
      signerName: body.signerName,
      licence: body.licence,
    });
    return NextResponse.json(result, { status: 201 });
  },
);
