import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { signedRevisionParamsSchema } from "@/lib/schemas/report-signature";
import { readSignedReport } from "@/lib/server/read-signed-report";

/** One signed revision's PDF, byte for byte as it was signed. */
export const GET = route(
  { params: signedRevisionParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const file = await readSignedReport(db, params);
    return new Response(new Uint8Array(file.body), { headers: file.headers });
  },
);
