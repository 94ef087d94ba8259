import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { projectSettingsSchema } from "@/lib/schemas/project-settings";
import { previewSettingsChange } from "@/lib/server/preview-settings-change";

/** What saving the settings would do: tendons judged again, verdicts changing, flags raised and closed; writes nothing. */
export const POST = route(
  {
    params: projectParamsSchema,
    body: projectSettingsSchema,
    access: ({ params }) => authorize("project.configure", params.projectId),
  },
  async ({ params, body, access }) =>
    previewSettingsChange(db, { projectId: params.projectId, values: body, by: access.user.id }),
);
