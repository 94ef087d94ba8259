import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { calibrationSchema } from "@/lib/schemas/calibration";
import { equipmentParamsSchema } from "@/lib/schemas/equipment";
import { previewAddCalibration } from "@/lib/server/preview-calibration-correction";

/** How many stored verdicts adding a calibration would judge again, whose would change, and the flags; writes nothing. */
export const POST = route(
  {
    params: equipmentParamsSchema,
    body: calibrationSchema,
    access: ({ params }) => authorize("equipment.manage", params.projectId),
  },
  async ({ params, body }) =>
    previewAddCalibration(db, { projectId: params.projectId, setId: params.setId, values: body }),
);
