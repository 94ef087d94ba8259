import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { tendonParamsSchema, tendonSchema } from "@/lib/schemas/tendon";
import { getTendonDetail } from "@/lib/server/get-tendon-detail";
import { updateTendon } from "@/lib/server/update-tendon";

/** The tendon with its prediction, force profile and target gauge pressure per equipment set. */
export const GET = route(
  { params: tendonParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => {
    const { project: _project, ...detail } = await getTendonDetail(db, params);
    void _project;
    return detail;
  },
);

/** Edits the tendon's schedule row; a stressed tendon is judged again in the same transaction. */
export const PATCH = route(
  {
    params: tendonParamsSchema,
    body: tendonSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    updateTendon(db, { projectId: params.projectId, tendonId: params.tendonId, values: body, by: access.user.id }),
);
