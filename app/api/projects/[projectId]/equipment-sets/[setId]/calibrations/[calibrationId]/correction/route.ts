import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationCorrectionSchema, calibrationParamsSchema } from "@/lib/schemas/calibration";
import { correctCalibration } from "@/lib/server/correct-calibration";

export const POST = route(
  {
    params: calibrationParamsSchema,
    body: calibrationCorrectionSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    NextResponse.json(
      await correctCalibration(db, {
        ...params,
        by: { id: access.user.id },
        reason: body.reason,
        values: body.calibration,
      }),
      { status: 201 },
    ),
);
