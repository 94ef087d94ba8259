import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { reportSignatureSchema } from "@/lib/schemas/report-signature";
import { listReportRevisions } from "@/lib/server/list-report-revisions";
import { signPourReport } from "@/lib/server/sign-pour-report";

/** The signed revisions of the pour's stressing report, and whether the report has changed since. */
export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const { timeZone, revisions, current } = await listReportRevisions(db, params);
    return { timeZone, revisions, current };
  },
);

/** The inspector signs the report as it stands: a new frozen revision. */
export const POST = route(
  {
    params: pourParamsSchema,
    body: reportSignatureSchema,
    access: ({ params }) => authorize("report.sign", params.projectId),
  },
  async ({ params, body, access }) => {
    const result = await signPourReport(db, { ...params, signer: { id: access.user.id }, values: body });
    return NextResponse.json(result, { status: 201 });
  },
);
