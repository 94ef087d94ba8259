import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { reportFileName } from "@/lib/reports/pour-rows";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { getPourReport } from "@/lib/server/get-pour-report";

/** The pour's stressing report as a PDF. */
export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const report = await getPourReport(db, params);
    const pdf = await renderPourPdf(report);
    return new Response(new Uint8Array(pdf), {
      headers: {
        "Content-Type": "application/pdf",
        "Content-Disposition": `attachment; filename="${reportFileName(report, "pdf")}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
