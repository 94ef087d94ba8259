import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { tendonParamsSchema } from "@/lib/schemas/tendon";
import { getTendonDetail } from "@/lib/server/get-tendon-detail";

/** The tendon with its prediction, force profile and target gauge pressure per equipment set. */
export const GET = route(
  { params: tendonParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => {
    const { project: _project, ...detail } = await getTendonDetail(db, params);
    void _project;
    return detail;
  },
);
