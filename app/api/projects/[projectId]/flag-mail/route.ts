import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { flagMailSchema } from "@/lib/schemas/flag-mail";
import { projectParamsSchema } from "@/lib/schemas/member";
import { setFlagMail } from "@/lib/server/set-flag-mail";

/** The caller's own choice, on this project, of one e-mail per flag or a digest per shift. */
export const PATCH = route(
  {
    params: projectParamsSchema,
    body: flagMailSchema,
    access: ({ params }) => authorize("flag_mail.choose", params.projectId),
  },
  async ({ params, body, access }) =>
    setFlagMail(db, { projectId: params.projectId, userId: access.user.id, mode: body.mode }),
);
