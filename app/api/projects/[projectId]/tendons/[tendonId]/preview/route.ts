import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { tendonParamsSchema, tendonSchema } from "@/lib/schemas/tendon";
import { previewTendonEdit } from "@/lib/server/preview-schedule-edit";

/** What saving this edit of the schedule row would do to the stressed tendons' verdicts; writes nothing. */
export const POST = route(
  {
    params: tendonParamsSchema,
    body: tendonSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    previewTendonEdit(db, { projectId: params.projectId, tendonId: params.tendonId, values: body, by: access.user.id }),
);
