import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { dailyRevisionParamsSchema } from "@/lib/schemas/daily-report";
import { readSignedDailyReport } from "@/lib/server/read-signed-report";

/** One signed revision of the day's report, byte for byte as it was signed. */
export const GET = route(
  { params: dailyRevisionParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const file = await readSignedDailyReport(db, params);
    return new Response(new Uint8Array(file.body), { headers: file.headers });
  },
);
