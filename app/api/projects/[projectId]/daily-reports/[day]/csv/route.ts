import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { renderDailyCsv } from "@/lib/reports/daily-csv";
import { dailyFileName } from "@/lib/reports/daily-rows";
import { dailyReportParamsSchema } from "@/lib/schemas/daily-report";
import { getDailyReport } from "@/lib/server/get-daily-report";

/** The day's special-inspection report as CSV, in the project's units. */
export const GET = route(
  { params: dailyReportParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const report = await getDailyReport(db, params);
    return new Response(renderDailyCsv(report), {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${dailyFileName(report, "csv")}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
