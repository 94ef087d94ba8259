import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { parseWith, route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { flagFilterSchema } from "@/lib/schemas/review";
import { findFlags } from "@/lib/server/find-flags";

export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("flag.review", params.projectId) },
  async ({ request, params }) => {
    const filter = parseWith(flagFilterSchema, Object.fromEntries(request.nextUrl.searchParams), "filter");
    return { tendons: await findFlags(db, { projectIds: [params.projectId], filter }) };
  },
);
