import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { strandLotParamsSchema, strandLotSchema } from "@/lib/schemas/strand-lot";
import { updateStrandLot } from "@/lib/server/update-strand-lot";

/** Corrects a lot's certificate values; its stressed tendons are judged again in the same transaction. */
export const PATCH = route(
  {
    params: strandLotParamsSchema,
    body: strandLotSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    updateStrandLot(db, {
      projectId: params.projectId,
      strandLotId: params.strandLotId,
      values: body,
      by: access.user.id,
    }),
);
