import { Caution } from "@/components/ui/caution";
import { VERDICT_LOOK, VerdictBadge } from "@/components/ui/verdict-badge";
import type { LocalVerdict } from "@/lib/offline/db";
import type { FieldProject, OpEvaluation } from "@/lib/schemas/sync";
import { showBandPct, showComputedLength, showForce, showLength, showPct, showPressure } from "@/lib/format/quantities";
import { heldUntil, type Hold, verdictHolds } from "@/lib/offline/hold-view";
import { flagLabel } from "@/lib/schemas/flag";
import { showBandAsRead, showPredictedAsRead } from "@/lib/stressing/display";

export const units = (p: FieldProject) => ({
  unitSystem: p.unitSystem,
  readingResolution: p.readingResolution,
});

/**
 * Measured, predicted and the band in the crew's own form: on an inch project fractions at the
 * reading division, with the decimals beside them only where they decide (`showBandAsRead`).
 */
function BandLine({ project, local }: { project: FieldProject; local: LocalVerdict }) {
  const u = units(project);
  const band = showBandAsRead(u, { lowerMm: local.lowerMm!, upperMm: local.upperMm!, measuredMm: local.measuredMm });
  const offDivision = band.decimals !== null;
  return (
    <p className="text-lead">
      Measured <strong>{showLength(u, local.measuredMm!)}</strong>
      {offDivision && <span className="text-body"> ({showComputedLength(u, local.measuredMm!)})</span>} against
      predicted <strong>{showPredictedAsRead(u, local.predictedMm!)}</strong>
      {offDivision && <span className="text-body"> ({showComputedLength(u, local.predictedMm!)})</span>}; the band is{" "}
      <strong data-testid="band">{band.read}</strong>
      {band.decimals && (
        <span className="text-body" data-testid="band-decimals">
          {" "}
          ({band.decimals}, which decides here)
        </span>
      )}{" "}
      (±{project.tolerancePct} %).
    </p>
  );
}

/** The tablet's verdict at once after saving, in words, icon and numbers, with the server's when it came back. */
export function VerdictPanel({
  project,
  local,
  server,
  settled = false,
  targetMPa,
  holds = [],
}: {
  project: FieldProject;
  local: LocalVerdict | null;
  server: OpEvaluation | null | undefined;
  /** The tendon is not held: every flag on it is closed by the engineer's or inspector's decision. */
  settled?: boolean;
  targetMPa: number | null;
  /** The tendon's open flags with the engineer's dispositions of the last sync: the words about the tails follow them. */
  holds?: Hold[];
}) {
  const u = units(project);
  // Once the server has judged, its verdict is the one that stands; the tablet's own is only until then.
  const shown = server
    ? { verdict: server.verdict, deviationPct: server.deviationPct, provisional: server.provisional }
    : local;
  const judgedBy = server
    ? server.provisional
      ? "Provisional, judged by the server"
      : "Judged by the server"
    : local?.provisional
      ? "Provisional, on this tablet until sent"
      : "On this tablet until sent";
  // What holds the tendon besides its elongation: the server's flags once it has judged, else the
  // flags the tablet's own judge expects the server to raise (under-force, a gauge off its target…).
  const holding = verdictHolds({ settled, server, local });
  const held = shown?.verdict === "in band" && holding.length > 0;
  return (
    <section aria-label="Verdict" className="card grid gap-3" data-testid="verdict">
      {local ? (
        <>
          <div className="flex flex-wrap items-center gap-3">
            <VerdictBadge size="lead" verdict={shown!.verdict} held={held}>
              {shown!.deviationPct !== null && (
                <span className="tabular-nums" data-testid="deviation">
                  {showPct(shown!.deviationPct)}
                </span>
              )}
            </VerdictBadge>
            <span className="text-label font-semibold uppercase" data-testid="judged-by">
              {judgedBy}
            </span>
          </div>
          {held && (
            <p
              className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-bold text-signal-stop"
              role="alert"
              data-testid="held-in-band"
            >
              Elongation in band, but {server ? "flagged" : "the server will flag"}: {holding.map(flagLabel).join("; ")}
              . {heldUntil(holds)}
            </p>
          )}
          {local.measuredMm !== null &&
          local.predictedMm !== null &&
          local.lowerMm !== null &&
          local.upperMm !== null ? (
            <BandLine project={project} local={local} />
          ) : (
            <p
              className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-bold text-signal-stop"
              role="alert"
              data-testid="incomplete"
            >
              No verdict: {(local.incomplete ?? []).join(" ") || "the reading cannot be judged yet."}
            </p>
          )}
          {local.reread && (
            <p
              className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-bold text-signal-stop"
              role="alert"
              data-testid="reread"
            >
              The reading division alone could change this verdict: read the elongation again to a finer division and
              save it as a correction (both readings are kept).
            </p>
          )}
          {local.basisLabel && <p data-testid="basis">Compared {local.basisLabel}.</p>}
          {local.governsLine && <p data-testid="governs">{local.governsLine}</p>}
          {local.forces?.length && local.specifiedForceN ? (
            <p data-testid="forces">
              Specified {showForce(u, local.specifiedForceN)}
              {local.specifiedForceFrom && ` (${local.specifiedForceFrom})`}
              {local.forces.map((f) => (
                <span key={f.end}>
                  {" "}
                  · end {f.end} ({f.role}): gauge{" "}
                  {f.gaugeForceN === null ? "no calibration" : showForce(u, f.gaugeForceN)}, elongation implies{" "}
                  {f.impliedForceN === null ? "—" : showForce(u, f.impliedForceN)}
                  {typeof f.differencePct === "number" && typeof f.bandPct === "number" && (
                    <span data-testid={`force-agreement-${f.end}`}>
                      {" "}
                      ({showPct(f.differencePct)},{" "}
                      {Math.abs(f.differencePct) <= f.bandPct + 1e-9 ? "within" : <strong>outside</strong>}{" "}
                      {showBandPct(f.bandPct)})
                    </span>
                  )}
                </span>
              ))}
            </p>
          ) : null}
          {!server && local.flagKinds && local.flagKinds.length > 0 && (
            <p className="font-semibold">The server will flag: {local.flagKinds.map(flagLabel).join("; ")}.</p>
          )}
          {local.missingEnds.length > 0 && (
            <p>
              End {local.missingEnds.join(" and ")} still to stress: the end read so far is judged provisionally (as
              stressed alone when the ends are pulled one after the other).
            </p>
          )}
          {targetMPa !== null && <p>Target gauge pressure for this set: {showPressure(u, targetMPa)}.</p>}
          {server ? (
            <p data-testid="server-verdict">
              Server evaluation: <strong>{VERDICT_LOOK[server.verdict].word}</strong>
              {server.deviationPct !== null ? ` ${showPct(server.deviationPct)}` : ""}
              {server.provisional ? " (provisional)" : ""}
              {server.flagKinds.length ? ` · flagged: ${server.flagKinds.map(flagLabel).join("; ")}` : ""}
            </p>
          ) : (
            <p className="text-ink-soft">
              The server evaluates it again when the record is sent; a flag goes to the engineer of record.
            </p>
          )}
          {shown!.verdict !== "in band" &&
            (settled && server && (shown!.verdict === "long" || shown!.verdict === "short") ? (
              <p className="font-semibold" data-testid="verdict-settled">
                Decided: every flag on this tendon is closed by the engineer&apos;s or inspector&apos;s decision (see
                the tendon&apos;s holds and tails below).
              </p>
            ) : (
              <p
                className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-bold text-signal-stop"
                role="alert"
                data-testid="out-of-band-hold"
              >
                Out of band. {heldUntil(holds)}
              </p>
            ))}
        </>
      ) : (
        <p>No reading yet on this tendon.</p>
      )}
      <Caution />
    </section>
  );
}
