import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { equipmentSetSchema } from "@/lib/schemas/equipment";
import { projectParamsSchema } from "@/lib/schemas/member";
import { createEquipmentSet } from "@/lib/server/create-equipment-set";
import { listEquipmentSets } from "@/lib/server/list-equipment-sets";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => ({
    equipmentSets: await listEquipmentSets(db, params.projectId),
  }),
);

export const POST = route(
  {
    params: projectParamsSchema,
    body: equipmentSetSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body }) =>
    NextResponse.json(await createEquipmentSet(db, { projectId: params.projectId, values: body }), { status: 201 }),
);
