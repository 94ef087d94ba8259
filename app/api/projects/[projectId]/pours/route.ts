import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { pourSchema } from "@/lib/schemas/pour";
import { listPours } from "@/lib/server/list-pours";
import { savePour } from "@/lib/server/save-pour";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => ({
    pours: await listPours(db, params.projectId),
  }),
);

export const POST = route(
  {
    params: projectParamsSchema,
    body: pourSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body }) =>
    NextResponse.json(await savePour(db, { projectId: params.projectId, values: body }), { status: 201 }),
);
