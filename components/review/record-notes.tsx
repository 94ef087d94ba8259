import type { DisplayUnits } from "@/lib/format/quantities";
import { showPct } from "@/lib/format/quantities";
import { storedGaugeOffTarget, storedGaugeSteps } from "@/lib/schemas/record";
import { rereadLine } from "@/lib/stressing/display";

/** The finer second reading of a stored record, or why it was not taken. */
export function RereadNote({
  project,
  record,
  className = "",
}: {
  project: DisplayUnits;
  record: Parameters<typeof rereadLine>[1];
  className?: string;
}) {
  const line = rereadLine(project, record);
  return line ? (
    <span className={`block ${className}`} data-testid="reread-line">
      {line}
    </span>
  ) : null;
}

/**
 * What a stored record's gauge reading carries besides its pressure: the gauge off its target
 * and kept by the crew with their reason, and the steps read on the way up.
 */
export function GaugeNotes({
  entered,
  pressure,
  length,
  className = "",
}: {
  entered: unknown;
  pressure: (mpa: number) => string;
  length: (mm: number) => string;
  className?: string;
}) {
  const off = storedGaugeOffTarget(entered);
  const steps = storedGaugeSteps(entered);
  return (
    <>
      {off && (
        <span className={`block font-bold ${className}`} data-testid="gauge-off-target">
          Gauge {showPct(off.pct)} off target, kept by the crew: {off.reason}
        </span>
      )}
      {steps && (
        <span className={`block text-ink-soft ${className}`} data-testid="gauge-steps-line">
          Gauge steps: {steps.map((s) => `${pressure(s.pressureMPa)}: ${length(s.readingMm)}`).join("; ")}
        </span>
      )}
    </>
  );
}
