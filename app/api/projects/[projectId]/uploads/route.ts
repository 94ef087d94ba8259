import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { UPLOAD_PERMISSION } from "@/lib/auth/permissions";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { presignUploadSchema } from "@/lib/schemas/upload";
import { presignUploadResponseSchema } from "@/lib/schemas/upload-response";
import { presignUpload } from "@/lib/storage";

/** Starts an upload: a pending attachment row and a presigned PUT for the browser. */
export const POST = route(
  {
    params: projectParamsSchema,
    body: presignUploadSchema,
    access: ({ params }) => authorize("project.view", params.projectId),
  },
  async ({ params, body, access }) => {
    await authorize(UPLOAD_PERMISSION[body.purpose], params.projectId);
    const result = await presignUpload(db, { projectId: params.projectId, uploadedBy: access.user.id, ...body });
    return NextResponse.json(presignUploadResponseSchema.parse(result), {
      status: 201,
      headers: { "Cache-Control": "no-store" },
    });
  },
);
