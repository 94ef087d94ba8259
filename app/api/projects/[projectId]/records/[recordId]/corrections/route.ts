import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { correctionParamsSchema, correctionSchema } from "@/lib/schemas/review";
import { correctRecord } from "@/lib/server/correct-record";

export const POST = route(
  {
    params: correctionParamsSchema,
    body: correctionSchema,
    access: ({ params }) => authorize("record.correct", params.projectId),
  },
  async ({ params, body, access }) => {
    const result = await correctRecord(db, { ...params, by: { id: access.user.id }, correction: body });
    return NextResponse.json(result, { status: 201 });
  },
);
