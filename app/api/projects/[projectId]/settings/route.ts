import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { projectSettingsSchema } from "@/lib/schemas/project-settings";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { updateProjectSettings } from "@/lib/server/update-project-settings";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("project.view", params.projectId) },
  async ({ params }) => getProjectSettings(db, params.projectId),
);

export const PATCH = route(
  {
    params: projectParamsSchema,
    body: projectSettingsSchema,
    access: ({ params }) => authorize("project.configure", params.projectId),
  },
  async ({ params, body, access }) => {
    await updateProjectSettings(db, { projectId: params.projectId, values: body, by: access.user.id });
    return getProjectSettings(db, params.projectId);
  },
);
