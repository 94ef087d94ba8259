import { Fragment } from "react";
import { formatDateTime, formatDay, formatRecentDateTime } from "@/lib/format/dates";
import type { TendonCase } from "@/lib/server/get-tendon-case";
import { wireBreakWords } from "@/lib/schemas/record";
import { CorrectionForm } from "./flag-actions";
import { GaugeNotes, RereadNote } from "./record-notes";

/** The day over the time ("2026-12-03" / "04:39 CST"), each unbroken, so the column stays narrow. */
function DayThenTime({ instant, timeZone }: { instant: string; timeZone: string }) {
  return (
    <>
      <span className="block whitespace-nowrap">{formatDay(instant, timeZone)}</span>
      {/* The same day as itself: the time with its zone. */}
      <span className="block whitespace-nowrap">{formatRecentDateTime(instant, timeZone, instant)}</span>
    </>
  );
}

/** Every stressing record of the tendon, all revisions, oldest first; photos link to the files. */
export function RecordsTable({
  c,
  showLength,
  showPressure,
  canCorrect,
  unit,
  timeZone,
}: {
  c: TendonCase;
  timeZone: string;
  showLength: (mm: number) => string;
  showPressure: (mpa: number) => string;
  canCorrect: boolean;
  unit: "in" | "mm";
}) {
  if (!c.records.length) return <p className="card">No stressing record has reached the server for this tendon yet.</p>;
  const heads = new Set([...new Map(c.records.map((r) => [r.chainId, r])).values()].map((r) => r.id));
  // The Map above keeps the last revision of each chain, since records come ordered by revision.
  return (
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Stressing records, scrolls sideways">
      <table className="w-full min-w-[36rem] bg-white">
        <thead>
          <tr className="border-b-2 border-ink text-left text-label uppercase">
            <th className="px-1.5 py-2">End</th>
            <th className="px-1.5 py-2">Stressed</th>
            <th className="px-1.5 py-2">Equipment</th>
            <th className="px-1.5 py-2 text-right">Gauge</th>
            <th className="px-1.5 py-2 text-right">Elongation</th>
            <th className="px-1.5 py-2">By</th>
            <th className="px-1.5 py-2">Notes</th>
          </tr>
        </thead>
        <tbody className="tabular-nums">
          {c.records.map((r) => {
            const photos = c.photos.filter((p) => p.record_id === r.id);
            const struck = heads.has(r.id) ? "" : "text-ink-faint line-through decoration-1";
            return (
              <Fragment key={r.id}>
                <tr className={`align-top ${r.skew ? "" : "border-b border-concrete-200"} ${struck}`}>
                  <td className="px-1.5 py-2 font-bold">{r.tendonEnd}</td>
                  <td className="px-1.5 py-2">
                    <DayThenTime instant={r.deviceTime} timeZone={timeZone} />
                  </td>
                  <td className="px-1.5 py-2">{r.equipmentSet}</td>
                  <td className="px-1.5 py-2 text-right">
                    {r.initialPressureMPa ? `${showPressure(r.initialPressureMPa)} → ` : ""}
                    {showPressure(r.finalPressureMPa)}
                  </td>
                  <td className="px-1.5 py-2 text-right font-semibold">{showLength(r.measuredMm)}</td>
                  <td className="px-1.5 py-2">{r.authorName}</td>
                  <td className="px-1.5 py-2">
                    {r.revision > 1 && (
                      <span className="block">
                        Revision {r.revision}: {r.revisionReason}
                      </span>
                    )}
                    {r.wireBreaks > 0 && (
                      <span className="block font-bold" data-testid="wire-breaks">
                        {r.wireBreaks} wire break(s)
                        {r.wireBreakDetails?.length ? `: ${r.wireBreakDetails.map(wireBreakWords).join("; ")}` : ""}
                      </span>
                    )}
                    <RereadNote project={c.basis.project} record={r} />
                    <GaugeNotes entered={r.entered} pressure={showPressure} length={showLength} />
                    {r.remarks && <span className="block">{r.remarks}</span>}
                    {r.concreteGoAhead && (
                      <span className="block" data-testid="concrete-go-ahead-reason">
                        <strong>Concrete unconfirmed, crew:</strong> {r.concreteGoAhead}
                      </span>
                    )}
                    {photos.map((p, i) => (
                      <a key={p.id} href={`/api/projects/${c.basis.project.id}/attachments/${p.id}`} className="block">
                        Photo {i + 1}
                      </a>
                    ))}
                    {canCorrect && heads.has(r.id) && (
                      <CorrectionForm projectId={c.basis.project.id} recordId={r.id} unit={unit} />
                    )}
                  </td>
                </tr>
                {r.skew && (
                  // Under its record across the whole width: in the Stressed column it made a tall, narrow block.
                  <tr className={`border-b border-concrete-200 ${struck}`}>
                    <td colSpan={7} className="px-2 pb-2">
                      <p className="border-l-4 border-signal-stop pl-2" data-clock-skew>
                        <strong>
                          Check the time:{" "}
                          {r.skew.future
                            ? "the tablet's time is after the server received it"
                            : "the tablet's clock and the server disagree"}
                          .
                        </strong>{" "}
                        Tablet: {formatDateTime(r.deviceTime, timeZone)} · Server received:{" "}
                        {formatDateTime(r.receivedAt, timeZone)}
                      </p>
                    </td>
                  </tr>
                )}
              </Fragment>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
