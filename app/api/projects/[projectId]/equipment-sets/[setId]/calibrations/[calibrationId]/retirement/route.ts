import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationParamsSchema, calibrationRetirementSchema } from "@/lib/schemas/calibration";
import { retireCalibration } from "@/lib/server/retire-calibration";

export const POST = route(
  {
    params: calibrationParamsSchema,
    body: calibrationRetirementSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    NextResponse.json(await retireCalibration(db, { ...params, by: { id: access.user.id }, reason: body.reason }), {
      status: 201,
    }),
);
