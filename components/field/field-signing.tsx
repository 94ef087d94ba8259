"use client";

import { FormField } from "@/components/ui/form-field";
import { useState } from "react";
import useSWR from "swr";
import { DailySignForm } from "@/components/reports/daily-sign-form";
import { PourSignForm } from "@/components/reports/pour-sign-form";
import type { SignedRevisionView } from "@/components/reports/report-signing";
import { SignedRevisions } from "@/components/reports/signed-revisions";
import { FormMessage } from "@/components/ui/form-message";
import { FetchError, fetchJson } from "@/lib/client/fetcher";
import { dayInZone, formatDateTime } from "@/lib/format/dates";
import type { WitnessGroupView } from "@/lib/reports/daily-rows";
import { DEFAULT_DAILY_STATEMENT, type DailyAttestation } from "@/lib/schemas/daily-report";
import { DEFAULT_POUR_STATEMENT } from "@/lib/schemas/report-signature";
import { useOnline } from "./use-live";
import { signatureStanding } from "@/lib/reports/signature-lines";

interface Me {
  name: string;
  memberships: { projectId: string; projectName: string; projectCode: string; role: string }[];
}
type Revision = SignedRevisionView;
interface Current {
  signed: boolean;
  changesSinceSigned: string[];
}
interface DailyView {
  day: string;
  timeZone: string;
  remarks: string;
  revisions: Revision[];
  current: Current;
  pours: { id: string; name: string }[];
  groups: WitnessGroupView[];
  exceptions: string[];
  attestation: DailyAttestation | null;
}
interface PourView {
  timeZone: string;
  revisions: Revision[];
  current: Current;
}

/** The first guess at today before the project's zone is known: the tablet's own day. */
const deviceDay = () => dayInZone(new Date(), Intl.DateTimeFormat().resolvedOptions().timeZone);
const shown = (revisions: Revision[], timeZone: string) =>
  revisions.map((r) => ({ ...r, signedAt: formatDateTime(r.signedAt, timeZone) }));

/**
 * The inspector signs on the tablet: the day's special-inspection report and the stressing report
 * of each pour worked that day, through the same route handlers and forms as the office (typed
 * name, licence or certification number, statement, one confirmation). Online only: a signature is
 * made on the server against the report as it stands there, so it never waits in the outbox.
 */
export function FieldSigning() {
  const online = useOnline();
  const [chosenProject, setProjectId] = useState("");
  const [day, setDay] = useState(deviceDay);
  // Until the inspector picks a day, the day is today at the site (the project's zone), once known.
  const [dayPicked, setDayPicked] = useState(false);
  const [pourId, setPourId] = useState(() =>
    typeof window === "undefined" ? "" : (new URLSearchParams(window.location.search).get("pour") ?? ""),
  );
  const [notice, setNotice] = useState<string | null>(null);
  // Read only with signal; swr keeps each answer and reads again after a signature.
  const meRead = useSWR<Me, FetchError>(online ? "/api/me" : null, fetchJson);
  const me = meRead.data ?? null;
  const inspecting = me?.memberships.filter((m) => m.role === "inspector") ?? [];
  const projectId = inspecting.some((m) => m.projectId === chosenProject)
    ? chosenProject
    : (inspecting[0]?.projectId ?? "");
  const dailyRead = useSWR<DailyView, FetchError>(
    online && projectId && day ? `/api/projects/${projectId}/daily-reports/${day}/signatures` : null,
    fetchJson,
    {
      onSuccess: (view) => {
        const siteToday = dayInZone(new Date(), view.timeZone);
        if (!dayPicked && siteToday !== view.day) setDay(siteToday);
      },
    },
  );
  const daily = dailyRead.data ?? null;
  const pourRead = useSWR<PourView, FetchError>(
    online && projectId && pourId ? `/api/projects/${projectId}/pours/${pourId}/report/signatures` : null,
    fetchJson,
  );
  const pour = pourRead.data ?? null;
  const failed = meRead.error ?? dailyRead.error ?? pourRead.error;
  const problem = !failed ? null : failed.status === 401 ? "Sign in again to sign reports." : failed.message;

  if (!online)
    return (
      <main className="mx-auto grid max-w-3xl gap-4 p-4">
        <h1 className="text-figure font-bold">Sign reports</h1>
        <p
          role="status"
          className="rounded-md border-2 border-signal-stop p-4 font-semibold"
          data-testid="sign-offline"
        >
          <span aria-hidden="true">⚠ </span>
          No connection: signing needs the server. A signature is made against the report as it stands on the server, so
          it cannot wait on the tablet. Records you save still keep on the tablet. This page is ready again as soon as
          the tablet has signal.
        </p>
      </main>
    );

  const pourName = daily?.pours.find((p) => p.id === pourId)?.name ?? "this pour";
  return (
    <main className="mx-auto grid max-w-3xl gap-6 p-4">
      <header className="grid gap-1">
        <h1 className="text-figure font-bold">Sign reports</h1>
        <p className="text-ink-soft">
          The day&apos;s special-inspection report and the stressing report of each pour, signed as they stand on the
          server. Your signature is final; a later change needs a new revision.
        </p>
      </header>
      {problem && <FormMessage tone="error">{problem}</FormMessage>}
      {notice && <FormMessage tone="info">{notice}</FormMessage>}
      {me && inspecting.length === 0 && (
        <p className="card">Only the special inspector signs reports; you are not the inspector on any project.</p>
      )}
      {inspecting.length > 0 && (
        <div className="grid gap-3 md:grid-cols-2">
          {inspecting.length > 1 && (
            <FormField
              as="select"
              id="sign-project"
              label="Project"
              value={projectId}
              onChange={(e) => {
                setProjectId(e.target.value);
                setPourId("");
              }}
            >
              {inspecting.map((m) => (
                <option key={m.projectId} value={m.projectId}>
                  {m.projectCode} · {m.projectName}
                </option>
              ))}
            </FormField>
          )}
          <FormField
            id="sign-day"
            type="date"
            label={`Day${daily ? ` (${daily.timeZone})` : ""}`}
            value={day}
            onChange={(e) => {
              setDayPicked(true);
              setDay(e.target.value);
            }}
          />
        </div>
      )}

      {daily && (
        <section aria-labelledby="field-daily-heading" className="card grid gap-3">
          <h2 id="field-daily-heading" className="text-lead font-bold">
            Daily special-inspection report: {daily.day}
          </h2>
          <p className="font-semibold" data-testid="field-daily-state">
            {signatureStanding("The report", daily.revisions[0]?.revision ?? null, daily.current.signed)}
          </p>
          <SignedRevisions
            api={`/api/projects/${projectId}/daily-reports/${daily.day}/signatures`}
            revisions={shown(daily.revisions, daily.timeZone)}
            current={daily.current}
          />
          <DailySignForm
            key={`${daily.day}-${daily.revisions.length}`}
            idPrefix="field-daily"
            api={`/api/projects/${projectId}/daily-reports/${daily.day}/signatures`}
            day={daily.day}
            nextRevision={(daily.revisions[0]?.revision ?? 0) + 1}
            groups={daily.groups}
            exceptions={daily.exceptions}
            previous={daily.attestation}
            remarks={daily.remarks}
            signerName={me?.name ?? ""}
            defaultStatement={DEFAULT_DAILY_STATEMENT}
            onSigned={(revision) => {
              setNotice(`The report of ${daily.day} is signed: revision ${revision}.`);
              void dailyRead.mutate();
            }}
          />
        </section>
      )}

      {daily && (
        <section aria-labelledby="field-pour-heading" className="card grid gap-3">
          <h2 id="field-pour-heading" className="text-lead font-bold">
            Stressing report of a pour
          </h2>
          {daily.pours.length === 0 ? (
            <p className="text-ink-soft">No pour was worked on {daily.day}.</p>
          ) : (
            <div className="flex flex-wrap gap-2" role="group" aria-label="Pours worked that day">
              {daily.pours.map((p) => (
                <button
                  key={p.id}
                  type="button"
                  className={p.id === pourId ? "btn-primary min-h-12" : "btn-quiet min-h-12"}
                  aria-pressed={p.id === pourId}
                  onClick={() => setPourId(p.id)}
                >
                  {p.name}
                </button>
              ))}
            </div>
          )}
          {pour && pourId && (
            <>
              <p className="font-semibold" data-testid="field-pour-state">
                {signatureStanding(
                  `The stressing report of ${pourName}`,
                  pour.revisions[0]?.revision ?? null,
                  pour.current.signed,
                )}
              </p>
              <SignedRevisions
                api={`/api/projects/${projectId}/pours/${pourId}/report/signatures`}
                revisions={shown(pour.revisions, pour.timeZone)}
                current={pour.current}
              />
              {!pour.current.signed && (
                <PourSignForm
                  key={`${pourId}-${pour.revisions.length}`}
                  idPrefix="field-pour"
                  api={`/api/projects/${projectId}/pours/${pourId}/report/signatures`}
                  pourName={pourName}
                  nextRevision={(pour.revisions[0]?.revision ?? 0) + 1}
                  signerName={me?.name ?? ""}
                  defaultStatement={DEFAULT_POUR_STATEMENT}
                  onSigned={(revision) => {
                    setNotice(`The stressing report of ${pourName} is signed: revision ${revision}.`);
                    void pourRead.mutate();
                  }}
                />
              )}
            </>
          )}
        </section>
      )}
    </main>
  );
}
