import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { concreteResultParamsSchema, concreteResultSchema } from "@/lib/schemas/concrete-result";
import { addConcreteResult } from "@/lib/server/add-concrete-result";
import { listConcreteResults } from "@/lib/server/list-concrete-results";

export const GET = route(
  { params: concreteResultParamsSchema, access: ({ params }) => authorize("project.view", params.projectId) },
  async ({ params }) => NextResponse.json(await listConcreteResults(db, params)),
);

export const POST = route(
  {
    params: concreteResultParamsSchema,
    body: concreteResultSchema,
    access: ({ params }) => authorize("concrete.confirm", params.projectId),
  },
  async ({ params, body, access }) => {
    const result = await addConcreteResult(db, {
      ...params,
      by: { id: access.user.id, name: access.user.name },
      result: body,
    });
    return NextResponse.json(result, { status: 201 });
  },
);
