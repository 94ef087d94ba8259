import Link from "next/link";
import { notFound } from "next/navigation";
import { ComputationSheet } from "@/components/review/computation-sheet";
import { DecisionSummary } from "@/components/review/decision-summary";
import { DispositionForm, ReviewForm } from "@/components/review/flag-actions";
import { FlagTrail } from "@/components/review/flag-trail";
import { RecordsTable } from "@/components/review/records-table";
import { Caution } from "@/components/ui/caution";
import { flagLabel } from "@/components/ui/verdict-badge";
import { db } from "@/db";
import { can } from "@/lib/auth/permissions";
import { isAppError } from "@/lib/errors";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { showLength, showPressure } from "@/lib/format/quantities";
import { isUuid, pageAccess } from "../../../page-access";

export const metadata = { title: "Tendon flags" };

/**
 * The engineer's and the inspector's page for one tendon. It opens on the decision: the flag the
 * e-mail named (`?flag=`), the verdict, the numbers that matter and the form; the evidence and the
 * calculation sheet follow, folded by section, beside the decision on a wide screen.
 */
export default async function TendonFlagsPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string; tendonId: string }>;
  searchParams: Promise<{ flag?: string | string[] }>;
}) {
  const { projectId, tendonId } = await params;
  const { flag: flagParam } = await searchParams;
  if (!isUuid(tendonId)) notFound();
  const access = await pageAccess("record.view", projectId);
  const c = await getTendonCase(db, { projectId, tendonId }).catch((e: unknown) => {
    if (isAppError(e) && e.code === "NOT_FOUND") notFound();
    throw e;
  });
  const p = c.basis.project;
  const timeZone = projectTimeZone(p);
  const open = c.flags
    .filter((f) => f.status !== "closed")
    .map((f) => ({
      id: f.id,
      label: `${f.reference} · ${flagLabel(f.kind)} (${f.status === "open" ? "open" : "with the engineer"})`,
    }));
  const requestedFlag = typeof flagParam === "string" ? c.flags.find((f) => f.id === flagParam) : undefined;
  const requested = requestedFlag?.id;
  // The flag the link named, never another: when it is closed the summary shows it as closed and
  // the forms choose nothing, so an open flag is decided only by choosing it.
  const requestedClosed = requestedFlag !== undefined && requestedFlag.status === "closed";
  const selected = requestedClosed ? "" : (requested ?? open[0]?.id);
  const unit = p.unitSystem === "us" ? "in" : "mm";
  const length = (mm: number) => showLength(p, mm);
  const mayDecide = can(access.role, "disposition.create");
  const mayReview = can(access.role, "flag.review");

  return (
    <main className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,36rem)] xl:grid-rows-[auto_1fr] xl:items-start">
      <header className="xl:col-start-1 xl:row-start-1">
        <p className="field-label">
          {access.projectName} · {c.basis.pour.name}
          {c.release && " · released"}
        </p>
        <h1 className="text-figure font-bold">Tendon {c.basis.tendon.tag}</h1>
        <p className="mt-1">
          <Link href="/review">Back to the flags</Link>
        </p>
      </header>

      <div
        className="space-y-4 xl:sticky xl:top-4 xl:col-start-2 xl:row-span-2 xl:row-start-1"
        data-testid="decision-column"
      >
        {requested === undefined && typeof flagParam === "string" && (
          <p role="status" className="rounded-md border-2 border-ink bg-concrete-100 p-3">
            The flag in the link is not on this tendon; showing {open.length ? "its first open flag" : "its flags"}{" "}
            instead.
          </p>
        )}
        {requestedClosed && (
          <p
            role="status"
            className="rounded-md border-2 border-ink bg-concrete-100 p-3"
            data-testid="link-flag-closed"
          >
            {requestedFlag.reference}, the flag in the link, is closed
            {requestedFlag.closedAt ? ` since ${formatDateTime(requestedFlag.closedAt, timeZone)}` : ""}
            {requestedFlag.closedByName ? ` by ${requestedFlag.closedByName}` : ""}; nothing more waits on it.
            {open.length > 0
              ? ` ${open.length === 1 ? "One other flag is" : `${open.length} other flags are`} open on this tendon: choose below the one you decide.`
              : ""}
          </p>
        )}
        <DecisionSummary c={c} flagId={requested ?? selected} timeZone={timeZone} />
        {open.length > 0 && (mayDecide || mayReview) ? (
          <section aria-labelledby="actions-heading" className="space-y-4">
            <h2 id="actions-heading" className="sr-only">
              {mayDecide ? "Decision" : "Findings"}
            </h2>
            {mayDecide && (
              <DispositionForm projectId={projectId} flags={open} engineerName={access.user.name} selected={selected} />
            )}
            {mayReview && <ReviewForm projectId={projectId} flags={open} unit={unit} selected={selected} />}
          </section>
        ) : (
          open.length === 0 && (
            <p className="card">Every flag on this tendon is closed; nothing waits for a decision.</p>
          )
        )}
        <Caution />
      </div>

      <div className="space-y-6 xl:col-start-1 xl:row-start-2">
        <section aria-labelledby="flags-heading" className="space-y-3">
          <h2 id="flags-heading" className="text-lead font-bold">
            Flags and their trail
          </h2>
          <FlagTrail c={c} showLength={length} timeZone={timeZone} selected={selected} />
        </section>

        <section aria-labelledby="records-heading" className="space-y-3">
          <h2 id="records-heading" className="text-lead font-bold">
            Stressing records
          </h2>
          <RecordsTable
            c={c}
            showLength={length}
            showPressure={(mpa) => showPressure(p, mpa)}
            canCorrect={can(access.role, "record.correct")}
            unit={unit}
            timeZone={timeZone}
          />
        </section>

        <section aria-labelledby="calc-heading" className="space-y-3">
          <h2 id="calc-heading" className="text-lead font-bold">
            Calculation sheet
          </h2>
          <p className="text-ink-soft">
            Evaluated by {c.evaluation?.engine_version ?? "the elongation engine"}
            {c.evaluation ? ` on ${formatDateTime(c.evaluation.created_at, timeZone)} (${c.evaluation.reason})` : ""}.
            Open or close each part.
          </p>
          <ComputationSheet c={c} />
        </section>
      </div>
    </main>
  );
}
