import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { strandLotParamsSchema, strandLotSchema } from "@/lib/schemas/strand-lot";
import { previewStrandLotEdit } from "@/lib/server/preview-schedule-edit";

/** What saving this edit of the lot would do to its stressed tendons' verdicts; writes nothing. */
export const POST = route(
  {
    params: strandLotParamsSchema,
    body: strandLotSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    previewStrandLotEdit(db, {
      projectId: params.projectId,
      strandLotId: params.strandLotId,
      values: body,
      by: access.user.id,
    }),
);
