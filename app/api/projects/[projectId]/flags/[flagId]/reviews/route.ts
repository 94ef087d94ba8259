import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { flagParamsSchema, reviewSchema } from "@/lib/schemas/review";
import { addReview } from "@/lib/server/add-review";

export const POST = route(
  { params: flagParamsSchema, body: reviewSchema, access: ({ params }) => authorize("flag.review", params.projectId) },
  async ({ params, body, access }) => {
    const result = await addReview(db, { ...params, author: { id: access.user.id }, review: body });
    return NextResponse.json(result, { status: 201 });
  },
);
