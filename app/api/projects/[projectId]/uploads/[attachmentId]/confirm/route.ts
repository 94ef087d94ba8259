import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { UPLOAD_PERMISSION } from "@/lib/auth/permissions";
import { route } from "@/lib/http/route";
import { attachmentParamsSchema } from "@/lib/schemas/upload";
import { attachmentPurpose, confirmUpload } from "@/lib/storage";

/** Checks the uploaded file by content and size, keeps its sha256 and marks it stored. */
export const POST = route(
  { params: attachmentParamsSchema, access: ({ params }) => authorize("project.view", params.projectId) },
  async ({ params }) => {
    // The same permission as starting an upload of this kind of file.
    await authorize(UPLOAD_PERMISSION[await attachmentPurpose(db, params)], params.projectId);
    return { attachment: await confirmUpload(db, params) };
  },
);
