import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { projectSettingsSchema } from "@/lib/schemas/project-settings";
import { previewBasisChange } from "@/lib/server/reevaluate-project";

/** How many stressed tendons a settings change would judge again, and whose verdict would change; writes nothing. */
export const POST = route(
  {
    params: projectParamsSchema,
    body: projectSettingsSchema,
    access: ({ params }) => authorize("project.configure", params.projectId),
  },
  async ({ params, body }) =>
    previewBasisChange(db, {
      projectId: params.projectId,
      basis: {
        tolerancePct: body.tolerancePct,
        shortTendonFloorMm: body.shortTendonFloorMm,
        frictionMu: body.frictionMu,
        wobblePerM: body.wobblePerM,
        anchorSetMm: body.anchorSetMm,
        comparisonBasis: body.comparisonBasis,
        requiredConcreteMPa: body.requiredConcreteMPa,
        ...(body.timeZone !== undefined && { timeZone: body.timeZone }),
        ...(body.jackingForceFactor !== undefined && { jackingForceFactor: body.jackingForceFactor }),
        ...(body.underForcePct !== undefined && { underForcePct: body.underForcePct }),
        ...(body.seatingExcessMm !== undefined && { seatingExcessMm: body.seatingExcessMm }),
        ...(body.governing !== undefined && { governing: body.governing }),
      },
    }),
);
