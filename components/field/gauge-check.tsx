import type { LocalRecord } from "@/lib/offline/db";
import type { FieldEquipmentSet, FieldEvaluation, FieldTendon } from "@/lib/schemas/sync";
import { gaugeCheckFigures, gaugeChecks, judgedFromRecords, type JudgedTendon } from "@/lib/stressing/gauge-check";

/**
 * The drift alarm on the pour: a set whose tendons come out long or short against the other sets
 * on this pour, worked out on the tablet from the evaluations the pull brought (the server's own,
 * with the records each judged) by the same function as the insight page and the inspector's
 * e-mail. Shown in the pour's header, so the crew sees it before taking the jack to the next tendon.
 */
export function GaugeCheck({
  className = "",
  tendons,
  latest,
  records,
  sets,
}: {
  className?: string;
  tendons: FieldTendon[];
  latest: (tendonId: string) => FieldEvaluation | undefined;
  records: LocalRecord[];
  sets: FieldEquipmentSet[];
}) {
  const recordById = new Map(records.map((r) => [r.id, r]));
  const setName = new Map(sets.map((s) => [s.id, s.name]));
  const judged = tendons
    .map((t) => latest(t.id))
    .map((e) => (e ? judgedFromRecords(e, recordById, setName) : null))
    .filter((j): j is JudgedTendon => j !== null);
  const checks = gaugeChecks(judged);
  if (!checks.length) return null;
  return (
    <section
      aria-labelledby="gauge-check-heading"
      className={`rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 text-signal-stop ${className}`}
      data-testid="gauge-check"
      role="alert"
    >
      <h2 id="gauge-check-heading" className="flex items-center gap-2 font-bold">
        <svg viewBox="0 0 24 24" className="h-6 w-6 shrink-0" aria-hidden="true">
          <circle cx="12" cy="13" r="8" fill="none" stroke="currentColor" strokeWidth="2.5" />
          <path d="M12 13l4-4M12 3v2" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
        </svg>
        Check {checks.length === 1 ? "this gauge" : "these gauges"} against the master gauge
      </h2>
      <ul className="mt-1 grid gap-1">
        {checks.map((c) => (
          <li key={c.setId} className="font-semibold tabular-nums" data-testid="gauge-check-set">
            {gaugeCheckFigures(c)}.
          </li>
        ))}
      </ul>
      <p className="mt-1 text-ink">
        Stop using the set until its gauge is checked or it is recalibrated; the inspector has been told, and the
        engineer of record decides what the tendons already stressed need.
      </p>
    </section>
  );
}
