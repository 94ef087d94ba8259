import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { listMembers } from "@/lib/server/list-members";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("members.view", params.projectId) },
  async ({ params }) => listMembers(db, params.projectId),
);
