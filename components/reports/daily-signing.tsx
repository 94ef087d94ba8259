"use client";

import { useRouter } from "next/navigation";
import type { DailyAttestation } from "@/lib/schemas/daily-report";
import type { WitnessGroupView } from "@/lib/reports/daily-rows";
import { DailySignForm } from "./daily-sign-form";
import type { SignedRevisionView } from "./report-signing";
import { SignedRevisions } from "./signed-revisions";
import { signatureStanding } from "@/lib/reports/signature-lines";

/**
 * The day's signed special-inspection reports and, for the inspector, the remarks and the form that
 * signs the day as it stands. The remarks print on the report and are part of what is signed: a
 * change to them asks for a new revision. Times come preformatted from the server.
 */
export function DailySigning({
  projectId,
  day,
  revisions,
  current,
  remarks,
  canSign,
  signerName,
  defaultStatement,
  groups,
  exceptions,
  previous,
}: {
  projectId: string;
  day: string;
  revisions: SignedRevisionView[];
  current: { signed: boolean; changesSinceSigned: string[] };
  remarks: string;
  canSign: boolean;
  signerName: string;
  defaultStatement: string;
  groups: WitnessGroupView[];
  exceptions: string[];
  previous: DailyAttestation | null;
}) {
  const router = useRouter();
  const api = `/api/projects/${projectId}/daily-reports/${day}/signatures`;
  const last = revisions[0];
  return (
    <div className="space-y-4">
      <p className="font-semibold" data-testid="daily-signature-state">
        {signatureStanding(`The report of ${day}`, last?.revision ?? null, current.signed)}
      </p>
      <SignedRevisions api={api} revisions={revisions} current={current} />
      {canSign ? (
        <DailySignForm
          api={api}
          day={day}
          nextRevision={(last?.revision ?? 0) + 1}
          groups={groups}
          exceptions={exceptions}
          previous={previous}
          remarks={remarks}
          signerName={signerName}
          defaultStatement={defaultStatement}
          onSigned={() => router.refresh()}
        />
      ) : (
        <p className="text-ink-soft">
          {remarks ? `Inspector's remarks: ${remarks}` : "The inspector has written no remarks for this day."} Only the
          special inspector signs this report.
        </p>
      )}
    </div>
  );
}
