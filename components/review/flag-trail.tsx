import { FlagChip } from "@/components/ui/verdict-badge";
import { formatDateTime } from "@/lib/format/dates";
import { pressureAsTyped } from "@/lib/format/quantities";
import { DECISION_LABELS } from "@/lib/schemas/review";
import { liftoffLine } from "@/lib/stressing/liftoff";
import type { TendonCase } from "@/lib/server/get-tendon-case";

const REVIEW_LABELS: Record<string, string> = {
  note: "Note",
  remeasured: "Re-measured",
  paperwork_error: "Paperwork error found",
  photo: "Photo",
  sent_to_engineer: "Sent to the engineer",
  closed_paperwork: "Closed as paperwork",
};

const UUID = "[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}";

/** A stored reason in words: the ids it names become what they are and when (no raw ids on screen). */
export function inWords(text: string, c: TendonCase, when: (d: Date | string) => string): string {
  return text
    .replace(new RegExp(`disposition (${UUID})`, "gi"), (_, id: string) => {
      const d = c.dispositions.find((x) => x.id === id);
      return d ? `disposition ${d.reference} of ${when(d.createdAt)}` : "the engineer's disposition";
    })
    .replace(new RegExp(`evaluation ${UUID}`, "gi"), "the new evaluation")
    .replace(new RegExp(`record ${UUID}`, "gi"), "the record")
    .replace(new RegExp(UUID, "gi"), "(reference on file)");
}

/** Each flag with its reason and its whole trail: findings, dispositions, closing. */
export function FlagTrail({
  c,
  showLength,
  timeZone,
  selected,
}: {
  c: TendonCase;
  showLength: (mm: number) => string;
  timeZone: string;
  selected?: string;
}) {
  const when = (d: Date | string) => formatDateTime(d, timeZone);
  if (!c.flags.length) return <p className="card">No flag has been raised on this tendon.</p>;
  return (
    <ol className="space-y-4">
      {c.flags.map((flag) => {
        const trail = [
          ...c.reviews
            .filter((r) => r.flag_id === flag.id)
            .map((r) => ({ at: r.created_at, kind: "review" as const, r })),
          ...c.dispositions
            .filter((d) => d.flagId === flag.id)
            .map((d) => ({ at: d.createdAt, kind: "disposition" as const, d })),
        ].sort((a, b) => +new Date(a.at) - +new Date(b.at));
        return (
          <li
            key={flag.id}
            className={`card ${flag.id === selected ? "border-2 border-ink" : ""}`}
            data-flag-kind={flag.kind}
            aria-current={flag.id === selected ? "true" : undefined}
          >
            <div className="flex flex-wrap items-center gap-3">
              <span className="font-bold tabular-nums">{flag.reference}</span>
              <FlagChip kind={flag.kind} status={flag.status} />
              <span className="text-label text-ink-faint">raised {when(flag.createdAt)}</span>
            </div>
            <p className="mt-2">{inWords(flag.reason, c, when)}</p>
            {trail.length > 0 && (
              <ol className="mt-3 space-y-2 border-l-4 border-concrete-300 pl-4">
                {trail.map((item) =>
                  item.kind === "review" ? (
                    <li key={item.r.id}>
                      <p className="text-label font-bold uppercase">
                        {REVIEW_LABELS[item.r.kind] ?? item.r.kind} · {item.r.author} · {when(item.r.created_at)}
                      </p>
                      <p>
                        {item.r.body}
                        {item.r.remeasured_mm !== null && (
                          <strong> Re-measured: {showLength(item.r.remeasured_mm)}.</strong>
                        )}
                        {item.r.attachment_id && (
                          <>
                            {" "}
                            <a href={`/api/projects/${c.basis.project.id}/attachments/${item.r.attachment_id}`}>
                              Open the photo
                            </a>
                          </>
                        )}
                      </p>
                    </li>
                  ) : (
                    <li key={item.d.id} className="rounded-md bg-concrete-100 p-3">
                      <p className="text-label font-bold uppercase">
                        {item.d.reference} · Disposition: {DECISION_LABELS[item.d.decision]} · {when(item.d.createdAt)}
                      </p>
                      <p>{item.d.reasons}</p>
                      <p className="mt-1 text-label">
                        {item.d.engineerName} — {item.d.licenceStatement}
                      </p>
                      {item.d.decision === "liftoff_check" && (
                        <LiftoffChecks c={c} dispositionId={item.d.id} when={when} />
                      )}
                      {item.d.decision === "detension_restress" && (
                        <Detensions c={c} dispositionId={item.d.id} when={when} />
                      )}
                    </li>
                  ),
                )}
              </ol>
            )}
            {flag.status === "closed" && (
              <p className="mt-3 text-label">
                Closed {flag.closedAt ? when(flag.closedAt) : ""}
                {flag.closedByName ? ` by ${flag.closedByName}` : ""}:{" "}
                {flag.closeReason ? inWords(flag.closeReason, c, when) : ""}
              </p>
            )}
          </li>
        );
      })}
    </ol>
  );
}

/** The lift-off checks a disposition ordered, as the server judged them, beside it. */
function LiftoffChecks({
  c,
  dispositionId,
  when,
}: {
  c: TendonCase;
  dispositionId: string;
  when: (d: Date | string) => string;
}) {
  const checks = c.liftoffChecks.filter((l) => l.dispositionId === dispositionId);
  const p = c.basis.project;
  if (!checks.length)
    return (
      <p className="mt-2 text-label" data-testid="liftoff-none">
        No lift-off check has come in from the crew yet.
      </p>
    );
  return (
    <ul className="mt-2 grid gap-2" aria-label="Lift-off checks">
      {checks.map((l) => {
        return (
          <li
            key={l.id}
            className={`rounded-md border-2 bg-white p-2 ${l.withinBand ? "border-signal-band" : "border-signal-stop"}`}
            data-testid="liftoff-check-result"
            data-within={String(l.withinBand)}
          >
            <p className={`font-bold ${l.withinBand ? "text-signal-band" : "text-signal-stop"}`}>
              {l.withinBand ? "✓ Lift-off within band" : "⚠ Lift-off outside band"}
            </p>
            <p>{liftoffLine(p, l)}</p>
            <p className="text-label">
              End {l.tendonEnd} · gauge {pressureAsTyped(p, l.entered, l.pressureMPa)} · set {l.equipmentSet},
              calibration of {l.calibratedOn} · {l.checkedByName}, {when(l.checkedAt)}
            </p>
          </li>
        );
      })}
    </ul>
  );
}

/** The detensions a disposition ordered, as the crew recorded them, beside it. */
function Detensions({
  c,
  dispositionId,
  when,
}: {
  c: TendonCase;
  dispositionId: string;
  when: (d: Date | string) => string;
}) {
  const detensions = c.detensions.filter((d) => d.dispositionId === dispositionId);
  const p = c.basis.project;
  if (!detensions.length)
    return (
      <p className="mt-2 text-label" data-testid="detension-none">
        No detension has come in from the crew yet.
      </p>
    );
  return (
    <div className="mt-2 grid gap-2">
      <ul className="grid gap-2" aria-label="Detensions">
        {detensions.map((d) => {
          return (
            <li key={d.id} className="rounded-md border-2 border-ink bg-white p-2" data-testid="detension-record">
              <p className="font-bold">
                Detensioned {when(d.detensionedAt)}: {d.strandsDetensioned} of {c.basis.tendon.strandCount} strand
                {c.basis.tendon.strandCount === 1 ? "" : "s"}
              </p>
              <p>
                Gauge at release: {d.entered ? pressureAsTyped(p, d.entered, d.releasePressureMPa) : "not read"}
                {d.remarks ? ` · ${d.remarks}` : ""}
              </p>
              <p className="text-label">
                Jack run by {d.operatorName} · set {d.equipmentSet} · recorded by {d.recordedByName}
              </p>
            </li>
          );
        })}
      </ul>
      <p className="font-semibold" data-testid="detension-restress-state">
        {c.awaitingRestress.length
          ? `Held: restress required at end ${c.awaitingRestress.join(" and ")} (no record since the detension).`
          : "Stressed again since the detension: the new record is judged above."}
      </p>
    </div>
  );
}
