import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationParamsSchema, calibrationRetirementSchema } from "@/lib/schemas/calibration";
import { previewCalibrationRetirement } from "@/lib/server/preview-calibration-correction";

/** How many stored verdicts retiring a calibration would judge again, whose would change, and the flags; writes nothing. */
export const POST = route(
  {
    params: calibrationParamsSchema,
    body: calibrationRetirementSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    previewCalibrationRetirement(db, { ...params, by: { id: access.user.id }, reason: body.reason }),
);
