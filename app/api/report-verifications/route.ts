import { db } from "@/db";
import { clientIp, route } from "@/lib/http/route";
import { reportVerificationSchema } from "@/lib/schemas/report-signature";
import { verifyReportFile } from "@/lib/server/verify-report-file";

/**
 * Public: anyone holding a report file asks whether it is a signed revision, by the file's sha256
 * (computed in their browser; the file itself never leaves it). Audited.
 */
export const POST = route({ body: reportVerificationSchema, access: "public" }, async ({ body, request }) =>
  verifyReportFile(db, { sha256: body.sha256, ip: clientIp(request) }),
);
