import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { getPourCsv } from "@/lib/server/get-pour-csv";

/**
 * The pour's stressing report as CSV: one row per stressing of each tendon end, in the project's
 * units, with the signature of the last signed revision when it is of this content, else a row
 * saying it is not signed.
 */
export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const { csv, fileName } = await getPourCsv(db, params);
    return new Response(csv, {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${fileName}"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
