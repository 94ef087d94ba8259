import Link from "next/link";
import { notFound } from "next/navigation";
import { ComputationSheet } from "@/components/review/computation-sheet";
import { DispositionForm, ReviewForm } from "@/components/review/flag-actions";
import { FlagTrail } from "@/components/review/flag-trail";
import { RecordsTable } from "@/components/review/records-table";
import { Caution } from "@/components/ui/caution";
import { FlagChip, flagLabel, VerdictBadge } from "@/components/ui/verdict-badge";
import { db } from "@/db";
import { can } from "@/lib/auth/permissions";
import { isAppError } from "@/lib/errors";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { showLength, showPressure } from "@/lib/stressing/display";
import { isUuid, pageAccess } from "../../../page-access";

export const metadata = { title: "Tendon flags" };

export default async function TendonFlagsPage({ params }: { params: Promise<{ projectId: string; tendonId: string }> }) {
  const { projectId, tendonId } = await params;
  if (!isUuid(tendonId)) notFound();
  const access = await pageAccess("record.view", projectId);
  const c = await getTendonCase(db, { projectId, tendonId }).catch((e: unknown) => {
    if (isAppError(e) && e.code === "NOT_FOUND") notFound();
    throw e;
  });
  const p = c.basis.project;
  const open = c.flags.filter((f) => f.status !== "closed").map((f) => ({ id: f.id, label: `${flagLabel(f.kind)} (${f.status === "open" ? "open" : "with the engineer"})` }));
  const unit = p.unitSystem === "us" ? "in" : "mm";
  const length = (mm: number) => showLength(p, mm);

  return (
    <main className="space-y-10">
      <header>
        <p className="field-label">
          {access.projectName} · {c.basis.pour.name}
          {c.release && " · released"}
        </p>
        <h1 className="text-hero font-bold">Tendon {c.basis.tendon.tag}</h1>
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {c.evaluation ? (
            <VerdictBadge verdict={c.evaluation.verdict} deviationPct={c.evaluation.deviation_pct} provisional={c.evaluation.provisional} />
          ) : (
            <span className="text-ink-soft">Not stressed yet</span>
          )}
          {c.flags.map((f) => (
            <FlagChip key={f.id} kind={f.kind} status={f.status} />
          ))}
        </div>
        <p className="mt-3">
          <Link href="/review">Back to the flags</Link>
        </p>
      </header>

      <Caution />

      <section aria-labelledby="flags-heading" className="space-y-4">
        <h2 id="flags-heading" className="text-figure font-bold">
          Flags and their trail
        </h2>
        <FlagTrail c={c} showLength={length} />
      </section>

      <section aria-labelledby="records-heading" className="space-y-3">
        <h2 id="records-heading" className="text-figure font-bold">
          Stressing records
        </h2>
        <RecordsTable c={c} showLength={length} showPressure={(mpa) => showPressure(p, mpa)} canCorrect={can(access.role, "record.correct")} unit={unit} />
      </section>

      <section aria-labelledby="calc-heading" className="space-y-3">
        <h2 id="calc-heading" className="text-figure font-bold">
          Computation
        </h2>
        <p className="text-ink-soft">
          Evaluated by {c.evaluation?.engine_version ?? "the elongation engine"}
          {c.evaluation ? ` on ${new Date(c.evaluation.created_at).toUTCString()} (${c.evaluation.reason})` : ""}.
        </p>
        <ComputationSheet c={c} />
      </section>

      <Caution />

      {open.length > 0 && (can(access.role, "flag.review") || can(access.role, "disposition.create")) && (
        <section aria-labelledby="actions-heading" className="space-y-4">
          <h2 id="actions-heading" className="text-figure font-bold">
            {access.role === "engineer" ? "Decision" : "Findings"}
          </h2>
          {can(access.role, "disposition.create") && <DispositionForm projectId={projectId} flags={open} engineerName={access.user.name} />}
          {can(access.role, "flag.review") && <ReviewForm projectId={projectId} flags={open} unit={unit} />}
        </section>
      )}
    </main>
  );
}
