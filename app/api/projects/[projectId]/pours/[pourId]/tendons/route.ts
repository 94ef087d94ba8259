import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { tendonSchema } from "@/lib/schemas/tendon";
import { createTendon } from "@/lib/server/create-tendon";
import { listTendons } from "@/lib/server/list-tendons";

export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => listTendons(db, params),
);

export const POST = route(
  {
    params: pourParamsSchema,
    body: tendonSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body }) => NextResponse.json(await createTendon(db, { ...params, values: body }), { status: 201 }),
);
