import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { dailyReportParamsSchema } from "@/lib/schemas/daily-report";
import { getDailyCsv } from "@/lib/server/get-daily-csv";

/**
 * The day's special-inspection report as CSV, in the project's units, with the signature of the
 * last signed revision when it is of this content, else a row saying it is not signed.
 */
export const GET = route(
  { params: dailyReportParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const { csv, fileName } = await getDailyCsv(db, params);
    return new Response(csv, {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${fileName}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
