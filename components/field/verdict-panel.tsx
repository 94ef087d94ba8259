import { Caution } from "@/components/ui/caution";
import type { LocalVerdict } from "@/lib/offline/db";
import type { FieldProject, OpEvaluation } from "@/lib/schemas/sync";
import { showComputedLength, showLength, showPct, showPressure, type StoredResolution } from "@/lib/stressing/display";

const LOOK = {
  "in band": { word: "In band", icon: "M5 12l4 4 10-10", cls: "border-signal-band bg-signal-band-bg text-signal-band" },
  long: { word: "Long", icon: "M12 19V5M5 12l7-7 7 7", cls: "border-signal-long bg-signal-long-bg text-signal-long" },
  short: { word: "Short", icon: "M12 5v14M5 12l7 7 7-7", cls: "border-signal-short bg-signal-short-bg text-signal-short" },
  incomplete: { word: "Incomplete", icon: "M6 12h12", cls: "border-concrete-500 bg-concrete-100 text-ink" },
} as const;

export const units = (p: FieldProject) => ({ unitSystem: p.unitSystem, readingResolution: p.readingResolution as StoredResolution });

export function VerdictMark({ verdict, children }: { verdict: keyof typeof LOOK; children?: React.ReactNode }) {
  const look = LOOK[verdict];
  return (
    <span className={`inline-flex min-h-touch items-center gap-2 rounded-md border-2 px-3 text-lead font-bold ${look.cls}`} data-verdict={verdict}>
      <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true">
        <path d={look.icon} fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      {look.word}
      {children}
    </span>
  );
}

/** The tablet's verdict at once after saving, in words, icon and numbers, with the server's when it came back. */
export function VerdictPanel({ project, local, server, targetMPa }: { project: FieldProject; local: LocalVerdict | null; server: OpEvaluation | null | undefined; targetMPa: number | null }) {
  const u = units(project);
  return (
    <section aria-label="Verdict" className="card grid gap-3" data-testid="verdict">
      {local ? (
        <>
          <div className="flex flex-wrap items-center gap-3">
            <VerdictMark verdict={local.verdict}>
              <span className="tabular-nums" data-testid="deviation">
                {showPct(local.deviationPct)}
              </span>
            </VerdictMark>
            <span className="text-label font-semibold uppercase">{local.provisional ? "Provisional, on this tablet" : "On this tablet"}</span>
          </div>
          <p className="text-lead">
            Measured <strong>{showLength(u, local.measuredMm)}</strong> against predicted <strong>{showComputedLength(u, local.predictedMm)}</strong>; the band is{" "}
            <strong data-testid="band">
              {showComputedLength(u, local.lowerMm)} to {showComputedLength(u, local.upperMm)}
            </strong>{" "}
            (±{project.tolerancePct} %).
          </p>
          {local.missingEnds.length > 0 && <p>End {local.missingEnds.join(" and ")} still to stress: this end is judged on its own share for now.</p>}
          {targetMPa !== null && <p>Target gauge pressure for this set: {showPressure(u, targetMPa)}.</p>}
          {server ? (
            <p data-testid="server-verdict">
              Server evaluation: <strong>{LOOK[server.verdict].word}</strong>
              {server.deviationPct !== null ? ` ${showPct(server.deviationPct)}` : ""}
              {server.provisional ? " (provisional)" : ""}
              {server.flagKinds.length ? ` · flagged: ${server.flagKinds.join(", ").replaceAll("_", " ")}` : ""}
            </p>
          ) : (
            <p className="text-ink-soft">The server evaluates it again when the record is sent; a flag goes to the engineer of record.</p>
          )}
          {local.verdict !== "in band" && (
            <p className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-bold text-signal-stop" role="alert">
              Out of band: do not cut the tails or grout until the engineer of record gives a disposition.
            </p>
          )}
        </>
      ) : (
        <p>No reading yet on this tendon.</p>
      )}
      <Caution />
    </section>
  );
}
