import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { fieldPourParamsSchema } from "@/lib/schemas/sync";
import { pullAnswer, pullAnswerSchema } from "@/lib/schemas/sync-response";
import { projectOfPour } from "@/lib/server/list-field-pours";
import { pullChanges } from "@/lib/server/pull-changes";

// Download for offline: everything the tablet needs about one pour, with the cursor to pull from.
export const GET = route(
  {
    params: fieldPourParamsSchema,
    access: async ({ params }) => authorize("record.create", await projectOfPour(db, params.pourId)),
    response: pullAnswerSchema,
  },
  async ({ params, access }) =>
    pullAnswer(await pullChanges(db, { user: access.user, cursor: "0", pourIds: [params.pourId] })),
);
