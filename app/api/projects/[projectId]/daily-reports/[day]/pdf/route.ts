import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { dailyFileName } from "@/lib/reports/daily-rows";
import { dailyReportParamsSchema } from "@/lib/schemas/daily-report";
import { getDailyReport } from "@/lib/server/get-daily-report";

/** The day's special-inspection report as a PDF, as it stands (unsigned; remarks of the last signed revision). */
export const GET = route(
  { params: dailyReportParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const report = await getDailyReport(db, params);
    const pdf = await renderDailyPdf(report);
    return new Response(new Uint8Array(pdf), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${dailyFileName(report, "pdf")}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
