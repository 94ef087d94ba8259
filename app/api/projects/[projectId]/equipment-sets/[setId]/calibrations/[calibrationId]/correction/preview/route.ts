import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationCorrectionSchema, calibrationParamsSchema } from "@/lib/schemas/calibration";
import { previewCalibrationCorrection } from "@/lib/server/preview-calibration-correction";

/** How many stored verdicts a calibration correction would judge again, and whose would change; writes nothing. */
export const POST = route(
  {
    params: calibrationParamsSchema,
    body: calibrationCorrectionSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    previewCalibrationCorrection(db, {
      ...params,
      by: { id: access.user.id },
      reason: body.reason,
      values: body.calibration,
    }),
);
