import { redirect } from "next/navigation";
import { FormField, type FieldMessages } from "@/components/ui/form-field";
import { ClockSkewList } from "@/components/review/clock-skew-list";
import { FlagQueue } from "@/components/review/flag-queue";
import { ReleaseList } from "@/components/review/release-list";
import { Caution } from "@/components/ui/caution";
import { flagLabel } from "@/components/ui/verdict-badge";
import { db } from "@/db";
import { can } from "@/lib/auth/permissions";
import { getSessionUser } from "@/lib/auth/session";
import { flagFilterSchema } from "@/lib/schemas/review";
import { zodFields } from "@/lib/schemas/zod-fields";
import { findClockSkews } from "@/lib/server/find-clock-skews";
import { findFlags } from "@/lib/server/find-flags";
import { findReleaseCandidates } from "@/lib/server/find-release-candidates";

export const metadata = { title: "Flags to review" };

const KINDS = flagFilterSchema.shape.kind.unwrap().options;

/** A filter of the list: "All" first, then each choice as [value, words]. */
function FilterSelect({
  id,
  name,
  label,
  value,
  error,
  choices,
}: {
  id: string;
  name: string;
  label: string;
  value: string | undefined;
  error: FieldMessages;
  choices: (readonly [string, string])[];
}) {
  return (
    <FormField as="select" id={id} name={name} label={label} defaultValue={value ?? ""} error={error}>
      <option value="">All</option>
      {choices.map(([v, words]) => (
        <option key={v} value={v}>
          {words}
        </option>
      ))}
    </FormField>
  );
}

export default async function ReviewPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const raw = Object.fromEntries(
    Object.entries(await searchParams)
      .map(([k, v]) => [k, Array.isArray(v) ? v[0] : v])
      .filter(([, v]) => v),
  );
  const parsed = flagFilterSchema.safeParse(raw);
  const filter = parsed.success ? parsed.data : flagFilterSchema.parse({});
  // A filter that cannot be read is said beside its box, never dropped without a word.
  const bad: Record<string, string[] | undefined> = parsed.success ? {} : zodFields(parsed.error);
  const projects = user.memberships.filter((m) => can(m.role, "flag.review"));
  const allowedIds = projects.map((p) => p.projectId);
  const projectIds = filter.projectId ? allowedIds.filter((id) => id === filter.projectId) : allowedIds;
  const [tendons, skewed] = await Promise.all([
    findFlags(db, { projectIds, filter }),
    // Records whose tablet time is off, on flagged tendons or not: the project and pour filters apply.
    findClockSkews(db, { projectIds, pourId: filter.pourId }),
  ]);
  const pours = [...new Map([...tendons, ...skewed].map((t) => [t.pourId, t.pourName] as const)).entries()];
  // On projects whose rule gives the release to the inspector, the pours to release are here too.
  const inspectorProjects = projects.filter((p) => p.role === "inspector").map((p) => p.projectId);
  const releasable = (await findReleaseCandidates(db, inspectorProjects)).filter((p) => p.releaseBy === "inspector");

  return (
    <main className="space-y-6">
      <h1 className="text-figure font-bold">Flags to review</h1>
      <p className="text-ink-soft">
        Every open flag on your projects, one tendon per card, oldest first; below them, every record whose tablet time
        needs checking.
      </p>
      {!parsed.success && <p className="card">Some filters in the address were not understood and were left out.</p>}
      <form className="card grid gap-4 md:grid-cols-5 md:items-end" method="get" aria-label="Filter the flags">
        <FilterSelect
          id="f-project"
          name="projectId"
          label="Project"
          value={filter.projectId}
          error={bad.projectId}
          choices={projects.map((p) => [p.projectId, p.projectName])}
        />
        <FilterSelect id="f-pour" name="pourId" label="Pour" value={filter.pourId} error={bad.pourId} choices={pours} />
        <FilterSelect
          id="f-kind"
          name="kind"
          label="Flag"
          value={filter.kind}
          error={bad.kind}
          choices={KINDS.map((k) => [k, flagLabel(k)])}
        />
        <FormField
          id="f-age"
          name="olderThanHours"
          label="Older than (hours)"
          numeric="integer"
          defaultValue={filter.olderThanHours ?? (typeof raw.olderThanHours === "string" ? raw.olderThanHours : "")}
          error={bad.olderThanHours}
        />
        <button type="submit" className="btn-primary">
          Filter
        </button>
      </form>
      <FlagQueue
        tendons={tendons}
        empty={
          projects.length
            ? "No open flag matches. Records that pass every check do not appear here."
            : "You review no project."
        }
      />
      {projects.length > 0 && <ClockSkewList records={skewed} />}
      {releasable.length > 0 && (
        <section aria-labelledby="release-heading" className="space-y-3">
          <h2 id="release-heading" className="text-lead font-bold">
            Pours you release
          </h2>
          <ReleaseList pours={releasable} canRelease={() => true} />
        </section>
      )}
      <Caution />
    </main>
  );
}
