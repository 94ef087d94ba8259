import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationSchema } from "@/lib/schemas/calibration";
import { equipmentParamsSchema } from "@/lib/schemas/equipment";
import { addCalibration } from "@/lib/server/add-calibration";

export const POST = route(
  {
    params: equipmentParamsSchema,
    body: calibrationSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body }) =>
    NextResponse.json(await addCalibration(db, { projectId: params.projectId, setId: params.setId, values: body }), {
      status: 201,
    }),
);
