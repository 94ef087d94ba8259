import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { attachmentParamsSchema } from "@/lib/schemas/upload";
import { readAttachment } from "@/lib/storage";

/** Downloads a stored file of the project: members only, always as a download, never sniffed. */
export const GET = route(
  { params: attachmentParamsSchema, access: ({ params }) => authorize("project.view", params.projectId) },
  async ({ params }) => {
    const { body, headers } = await readAttachment(db, params);
    return new Response(Buffer.from(body), { status: 200, headers });
  },
);
