import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { strandLotSchema } from "@/lib/schemas/strand-lot";
import { createStrandLot } from "@/lib/server/create-strand-lot";
import { listStrandLots } from "@/lib/server/list-strand-lots";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => ({
    strandLots: await listStrandLots(db, params.projectId),
  }),
);

export const POST = route(
  {
    params: projectParamsSchema,
    body: strandLotSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body }) =>
    NextResponse.json(await createStrandLot(db, { projectId: params.projectId, values: body }), { status: 201 }),
);
