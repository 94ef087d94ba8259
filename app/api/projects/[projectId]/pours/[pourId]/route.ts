import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { pourParamsSchema, pourSchema } from "@/lib/schemas/pour";
import { savePour } from "@/lib/server/save-pour";

export const PATCH = route(
  {
    params: pourParamsSchema,
    body: pourSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body }) => savePour(db, { projectId: params.projectId, pourId: params.pourId, values: body }),
);
