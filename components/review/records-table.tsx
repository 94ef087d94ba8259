import { formatDateTime } from "@/lib/format/dates";
import type { TendonCase } from "@/lib/server/get-tendon-case";
import { storedWireBreaks, wireBreakWords } from "@/lib/schemas/record";
import { CorrectionForm } from "./flag-actions";
import { GaugeNotes, RereadNote } from "./record-notes";

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
  const heads = new Set([...new Map(c.records.map((r) => [r.chain_id, r])).values()].map((r) => r.id));
  // The Map above keeps the last revision of each chain, since records come ordered by revision.
  return (
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Stressing records, scrolls sideways">
      <table className="w-full min-w-[36rem] bg-white">
        <thead>
          <tr className="border-b-2 border-ink text-left text-label uppercase">
            <th className="p-2">End</th>
            <th className="p-2">Stressed</th>
            <th className="p-2">Equipment</th>
            <th className="p-2 text-right">Gauge</th>
            <th className="p-2 text-right">Elongation</th>
            <th className="p-2">By</th>
            <th className="p-2">Notes</th>
          </tr>
        </thead>
        <tbody className="tabular-nums">
          {c.records.map((r) => {
            const photos = c.photos.filter((p) => p.record_id === r.id);
            return (
              <tr
                key={r.id}
                className={`border-b border-concrete-200 align-top ${heads.has(r.id) ? "" : "text-ink-faint line-through decoration-1"}`}
              >
                <td className="p-2 font-bold">{r.tendon_end}</td>
                <td className="p-2">
                  <span className="whitespace-nowrap xl:whitespace-normal">
                    {formatDateTime(r.device_time, timeZone)}
                  </span>
                  {r.skew && (
                    <span className="mt-1 block border-l-4 border-signal-stop pl-2 font-bold" data-clock-skew>
                      Check the time:{" "}
                      {r.skew.future
                        ? "the tablet's time is after the server received it"
                        : "the tablet's clock and the server disagree"}
                      <span className="block font-normal">Tablet: {formatDateTime(r.device_time, timeZone)}</span>
                      <span className="block font-normal">
                        Server received: {formatDateTime(r.received_at, timeZone)}
                      </span>
                    </span>
                  )}
                </td>
                <td className="p-2">{r.equipmentSet}</td>
                <td className="p-2 text-right">
                  {r.initial_pressure_mpa ? `${showPressure(r.initial_pressure_mpa)} → ` : ""}
                  {showPressure(r.final_pressure_mpa)}
                </td>
                <td className="p-2 text-right font-semibold">{showLength(r.measured_mm)}</td>
                <td className="p-2">{r.author}</td>
                <td className="p-2">
                  {r.revision > 1 && (
                    <span className="block">
                      Revision {r.revision}: {r.revision_reason}
                    </span>
                  )}
                  {r.wire_breaks > 0 && (
                    <span className="block font-bold" data-testid="wire-breaks">
                      {r.wire_breaks} wire break(s)
                      {storedWireBreaks(r.wire_break_details)?.length
                        ? `: ${storedWireBreaks(r.wire_break_details)!.map(wireBreakWords).join("; ")}`
                        : ""}
                    </span>
                  )}
                  <RereadNote project={c.basis.project} record={r} />
                  <GaugeNotes entered={r.entered} pressure={showPressure} length={showLength} />
                  {r.remarks && <span className="block">{r.remarks}</span>}
                  {r.concrete_go_ahead && (
                    <span className="block" data-testid="concrete-go-ahead-reason">
                      <strong>Concrete unconfirmed, crew:</strong> {r.concrete_go_ahead}
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
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
