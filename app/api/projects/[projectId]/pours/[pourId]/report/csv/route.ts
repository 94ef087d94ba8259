import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { renderPourCsv } from "@/lib/reports/pour-csv";
import { reportFileName } from "@/lib/reports/pour-rows";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { getPourReport } from "@/lib/server/get-pour-report";

/** The pour's stressing report as CSV: one row per tendon end read, in the project's units. */
export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const report = await getPourReport(db, params);
    return new Response(renderPourCsv(report), {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${reportFileName(report, "csv")}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
