import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { dispositionSchema, flagParamsSchema } from "@/lib/schemas/review";
import { recordDisposition } from "@/lib/server/record-disposition";

export const POST = route(
  {
    params: flagParamsSchema,
    body: dispositionSchema,
    access: ({ params }) => authorize("disposition.create", params.projectId),
  },
  async ({ params, body, access }) => {
    const engineer = { id: access.user.id, name: access.user.name };
    const result = await recordDisposition(db, { ...params, engineer, disposition: body });
    return NextResponse.json(result, { status: 201 });
  },
);
