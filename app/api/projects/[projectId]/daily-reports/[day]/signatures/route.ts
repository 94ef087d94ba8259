import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { openExceptionLines, witnessGroupViews } from "@/lib/reports/daily-rows";
import { dailyReportParamsSchema, dailySignatureSchema } from "@/lib/schemas/daily-report";
import { listDailyRevisions } from "@/lib/server/list-daily-revisions";
import { signDailyReport } from "@/lib/server/sign-daily-report";

/**
 * The signed revisions of the day's report and whether the day has changed since, with what the
 * signing form asks about (the pours of the day, the groups stressed, the open exceptions, what was
 * last attested): the tablet signs from this alone.
 */
export const GET = route(
  { params: dailyReportParamsSchema, access: ({ params }) => authorize("report.download", params.projectId) },
  async ({ params }) => {
    const { report, revisions, current } = await listDailyRevisions(db, params);
    return {
      day: report.day,
      timeZone: report.timeZone,
      remarks: report.remarks,
      revisions,
      current,
      pours: report.pours.map((p) => ({ id: p.report.pour.id, name: p.report.pour.name })),
      groups: witnessGroupViews(report),
      exceptions: openExceptionLines(report),
      attestation: report.attestation,
    };
  },
);

/** The inspector signs the day's report as it stands, with their remarks: a new frozen revision. */
export const POST = route(
  {
    params: dailyReportParamsSchema,
    body: dailySignatureSchema,
    access: ({ params }) => authorize("report.sign", params.projectId),
  },
  async ({ params, body, access }) => {
    const result = await signDailyReport(db, { ...params, signer: { id: access.user.id }, values: body });
    return NextResponse.json(result, { status: 201 });
  },
);
