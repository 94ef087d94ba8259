import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorizeOperator } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { createProjectSchema } from "@/lib/schemas/member";
import { createProject } from "@/lib/server/create-project";

export const POST = route(
  { access: () => authorizeOperator(), body: createProjectSchema },
  async ({ body, access }) => {
    const result = await createProject(db, { ...body, by: { id: access.id, name: access.name } });
    return NextResponse.json(result, { status: 201 });
  },
);
