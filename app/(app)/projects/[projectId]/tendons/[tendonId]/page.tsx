import Link from "next/link";
import { notFound } from "next/navigation";
import { ForceProfileChart } from "@/components/review/force-profile-chart";
import { GaugeNotes, RereadNote } from "@/components/review/record-notes";
import { TendonForm } from "@/components/tendons/tendon-form";
import { Caution } from "@/components/ui/caution";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { db } from "@/db";
import { isAppError } from "@/lib/errors";
import { CALIBRATION_STATE_LABELS } from "@/lib/schemas/calibration";
import { displayUnits } from "@/lib/schemas/project-settings";
import { KIND_LABELS, type TendonInput } from "@/lib/schemas/tendon";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import { getTendonDetail, SHOP_DRAWING_MARK_PCT } from "@/lib/server/get-tendon-detail";
import { listStrandLots } from "@/lib/server/list-strand-lots";
import { listTendonReadings } from "@/lib/server/list-tendon-readings";
import { formatForce, formatLength, formatPressure } from "@/lib/units";
import { specifiedForceSourceWords } from "@/lib/stressing/display";
import {
  showArea,
  showComputedLength,
  showLongLength,
  showModulus,
  showPct,
  type DisplayUnits,
} from "@/lib/format/quantities";
import { isUuid, pageAccess } from "../../page-access";

export const metadata = { title: "Tendon" };

const Figure = ({ label, value, note }: { label: string; value: string; note?: string }) => (
  <div className="card">
    <p className="field-label">{label}</p>
    <p className="text-figure font-bold">{value}</p>
    {note && <p className="mt-1 text-label text-ink-soft">{note}</p>}
  </div>
);

export default async function TendonPage({ params }: { params: Promise<{ projectId: string; tendonId: string }> }) {
  const { projectId, tendonId } = await params;
  const access = await pageAccess("schedule.view", projectId);
  if (!isUuid(tendonId)) notFound();
  const [detail, readings] = await Promise.all([
    getTendonDetail(db, { projectId, tendonId }).catch((e: unknown) => {
      if (isAppError(e) && e.code === "NOT_FOUND") notFound();
      throw e;
    }),
    listTendonReadings(db, { projectId, tendonId }),
  ]);
  const { tendon, computed, targets, project } = detail;
  const u = displayUnits(project);
  const us = u.system === "US";
  const len = (mm: number) => formatLength(mm, u.resolution);
  // Elongations to 0.01 in or 0.1 mm on this sheet, finer than a reading, so differences show.
  const shown: Pick<DisplayUnits, "unitSystem"> = { unitSystem: us ? "us" : "si" };
  const fine = (mm: number) => showComputedLength(shown, mm);
  const force = (n: number) => formatForce(n, { unit: u.force });
  const pressure = (mpa: number) => formatPressure(mpa, { unit: u.pressure });
  const long = (mm: number) => showLongLength(shown, mm);
  const canManage = access.role === "admin";
  const lots = canManage && !tendon.pour.released ? await listStrandLots(db, projectId) : [];

  return (
    <main className="space-y-6">
      <p className="field-label">
        {access.projectName} ·{" "}
        {canManage ? (
          <Link href={`/projects/${projectId}/pours/${tendon.pour.id}`}>{tendon.pour.name}</Link>
        ) : (
          tendon.pour.name
        )}
      </p>
      <h1 className="text-hero font-bold">Tendon {tendon.tag}</h1>
      <p className="text-lead">
        {KIND_LABELS[tendon.kind]} · {tendon.strandCount} × {tendon.strandSize} strand · stressed at{" "}
        {tendon.ends === "both" ? "both ends" : `end ${tendon.ends}`} ·{" "}
        {long(tendon.segments.reduce((s, x) => s + x.lengthMm, 0))} in {tendon.segments.length} segments ·{" "}
        {tendon.lot ? `strand lot ${tendon.lot.lotNumber}` : "no strand lot (nominal values)"}
        {tendon.member ? ` · member ${tendon.member}` : ""}
      </p>

      {!computed.ok ? (
        <p
          role="alert"
          className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-4 font-semibold text-signal-stop"
        >
          {computed.message}
        </p>
      ) : (
        <>
          <section aria-labelledby="prediction-heading" className="space-y-4">
            <h2 id="prediction-heading" className="text-lead font-semibold">
              Predicted elongation (
              {project.comparisonBasis === "net"
                ? "net of anchor set, as marks read after lock-off"
                : "gross at jacking"}
              )
            </h2>
            <div className="grid gap-4 md:grid-cols-4">
              <Figure
                label="Compared with the readings"
                value={len(computed.prediction.predictedMm)}
                note={`${fine(computed.prediction.predictedMm)} · band ±${project.tolerancePct} %`}
              />
              <Figure
                label="Gross at jacking"
                value={fine(computed.prediction.prediction.grossMm)}
                note={
                  computed.prediction.gripMm > 0
                    ? `includes ${fine(computed.prediction.gripMm)} of strand in the jack per stressed end`
                    : "strand in the jack not counted"
                }
              />
              <Figure
                label="Net of anchor set"
                value={fine(computed.prediction.prediction.netMm)}
                note={`anchor set ${fine(project.anchorSetMm)} per stressed end`}
              />
              <Figure
                label="Jacking force"
                value={force(computed.prediction.jackingForceN)}
                note={
                  computed.prediction.jackingForceSource === "schedule"
                    ? "from the schedule (at most 0.80·fpu·A, ACI 318-19 Table 20.3.2.5.1)"
                    : `${specifiedForceSourceWords("project", computed.prediction.jackingForceFactor)} of the nominal strand, the project's factor (ACI 318-19 Table 20.3.2.5.1 allows at most 0.80·fpu·A)`
                }
              />
            </div>
            {tendon.ends === "both" && (
              <p>
                Per end, for information: A {fine(computed.prediction.prediction.perEndMm.A ?? 0)}, B{" "}
                {fine(computed.prediction.prediction.perEndMm.B ?? 0)}.
              </p>
            )}
            <p>
              Strand values:{" "}
              {computed.prediction.strand.source === "strand lot"
                ? `mill certificate of lot ${tendon.lot?.lotNumber}`
                : "ASTM A416 nominal"}{" "}
              — area {showArea(shown, computed.prediction.strand.areaMm2)}
              {us ? ` (${showArea({ unitSystem: "si" }, computed.prediction.strand.areaMm2)})` : ""}, modulus{" "}
              {showModulus(shown, computed.prediction.strand.modulusMPa)}
              {us ? ` (${showModulus({ unitSystem: "si" }, computed.prediction.strand.modulusMPa)})` : ""}.
              {computed.nominalPredictedMm !== null &&
                ` On nominal values the prediction would be ${fine(computed.nominalPredictedMm)} (${showPct(((computed.prediction.predictedMm - computed.nominalPredictedMm) / computed.nominalPredictedMm) * 100)} change from the lot).`}
            </p>
            {computed.prediction.prediction.seating && (
              <p>
                Anchor set reaches {long(computed.prediction.prediction.seating.influenceMm)} from the stressed end;
                force at the anchor after seating {force(computed.prediction.prediction.seating.anchorForceAfterN)}.
              </p>
            )}
            {computed.checks.length > 0 && (
              <ul className="space-y-1">
                {computed.checks.map((c) => (
                  <li
                    key={c.code}
                    className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-semibold text-signal-stop"
                  >
                    <span aria-hidden="true">⚠ </span>
                    {c.message}
                  </li>
                ))}
              </ul>
            )}
          </section>

          <section aria-labelledby="shop-heading" className="card">
            <h2 id="shop-heading" className="text-lead font-semibold">
              Shop drawing
            </h2>
            {computed.shopDifferencePct === null || tendon.shopElongationMm === null ? (
              <p className="mt-1">The shop drawing gives no elongation for this tendon.</p>
            ) : computed.shopMarked ? (
              <p className="mt-2 rounded-md border-2 border-signal-long bg-signal-long-bg p-3 font-semibold text-signal-long">
                <span aria-hidden="true">⚠ </span>Check with the detailer: the shop drawing gives{" "}
                {fine(tendon.shopElongationMm)}, {showPct(computed.shopDifferencePct)} from ours (more than{" "}
                {SHOP_DRAWING_MARK_PCT} %).
              </p>
            ) : (
              <p className="mt-2 font-semibold">
                <span aria-hidden="true">✓ </span>The shop drawing gives {fine(tendon.shopElongationMm)},{" "}
                {showPct(computed.shopDifferencePct)} from ours (within {SHOP_DRAWING_MARK_PCT} %).
              </p>
            )}
          </section>

          <section aria-labelledby="profile-heading" className="card">
            <h2 id="profile-heading" className="text-lead font-semibold">
              Force along the tendon
            </h2>
            <ForceProfileChart profile={computed.profile} project={shown} formatLength={long} />
          </section>
        </>
      )}

      <section aria-labelledby="readings-heading" className="card">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id="readings-heading" className="text-lead font-semibold">
            Readings
          </h2>
          {readings.evaluation && (
            <VerdictBadge
              verdict={readings.evaluation.verdict}
              deviationPct={readings.evaluation.deviation_pct}
              provisional={readings.evaluation.provisional}
            />
          )}
        </div>
        {readings.records.length === 0 ? (
          <p className="mt-1">No end of this tendon has been stressed yet.</p>
        ) : (
          <>
            <table className="mt-2 w-full text-left">
              <thead>
                <tr className="border-b-2 border-ink">
                  <th className="p-2">End</th>
                  <th className="p-2">Stressed</th>
                  <th className="p-2">Set</th>
                  <th className="p-2 text-right">Gauge</th>
                  <th className="p-2 text-right">Elongation</th>
                  <th className="p-2">Read by</th>
                </tr>
              </thead>
              <tbody className="tabular-nums">
                {readings.records.map((r) => (
                  <tr key={r.id} className="border-b border-concrete-300">
                    <td className="p-2 font-semibold">{r.tendonEnd}</td>
                    <td className="p-2 whitespace-nowrap">{formatDateTime(r.deviceTime, projectTimeZone(project))}</td>
                    <td className="p-2">{r.equipmentSet}</td>
                    <td className="p-2 text-right">
                      {pressure(r.finalPressureMPa)}
                      <GaugeNotes entered={r.entered} pressure={pressure} length={len} className="text-base" />
                    </td>
                    <td className="p-2 text-right font-semibold">
                      {len(r.measuredMm)}
                      {r.wireBreaks > 0 ? ` · ${r.wireBreaks} wire break${r.wireBreaks > 1 ? "s" : ""}` : ""}
                      <RereadNote project={project} record={r} className="text-base font-normal" />
                    </td>
                    <td className="p-2">
                      {r.authorName}
                      {r.revision > 1 ? ` (revision ${r.revision})` : ""}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="mt-2">
              <Link href={`/projects/${projectId}/tendons/${tendonId}/flags`}>
                Flags, the whole trail and the calculation sheet
              </Link>
            </p>
          </>
        )}
      </section>

      <section aria-labelledby="targets-heading" className="card">
        <h2 id="targets-heading" className="text-lead font-semibold">
          Target gauge pressure by equipment set
        </h2>
        {targets.length === 0 ? (
          <p className="mt-1">No equipment sets on the project yet.</p>
        ) : (
          <table className="mt-2 w-full text-left">
            <thead>
              <tr className="border-b-2 border-ink">
                <th className="p-2">Set</th>
                <th className="p-2 text-right">Target pressure</th>
                <th className="p-2">Calibration</th>
                <th className="p-2">Notes</th>
              </tr>
            </thead>
            <tbody>
              {targets.map((t) => (
                <tr key={t.setId} className="border-b border-concrete-300">
                  <td className="p-2 font-semibold">{t.name}</td>
                  <td className="p-2 text-right text-lead font-bold">
                    {t.targetPressureMPa === null ? "—" : pressure(t.targetPressureMPa)}
                  </td>
                  <td
                    className={`p-2 font-semibold ${t.state === "expired" || t.state === "none" ? "text-signal-stop" : t.state === "expiring" ? "text-signal-long" : ""}`}
                  >
                    <span aria-hidden="true">{t.state === "valid" ? "✓ " : t.state === "expiring" ? "⚠ " : "⚠ "}</span>
                    {CALIBRATION_STATE_LABELS[t.state]}
                    {t.validUntil ? ` (to ${t.validUntil})` : ""}
                  </td>
                  <td className="p-2">{t.notes.join(" ") || "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {canManage &&
        (tendon.pour.released ? (
          <p className="card">
            {tendon.pour.name} is released: its schedule takes no edit unless the engineer of record reopens it.
          </p>
        ) : (
          <details id="edit-tendon">
            <summary className="btn-quiet inline-flex min-h-touch cursor-pointer items-center">
              Edit this tendon&apos;s schedule row
            </summary>
            <div className="mt-3">
              <TendonForm
                projectId={projectId}
                pourId={tendon.pour.id}
                us={us}
                lots={lots.map((l) => ({ id: l.id, lotNumber: l.lotNumber, strandSize: l.strandSize }))}
                tendon={{
                  id: tendon.id,
                  tag: tendon.tag,
                  kind: tendon.kind,
                  strandSize: tendon.strandSize as TendonInput["strandSize"],
                  strandCount: tendon.strandCount,
                  segments: tendon.segments,
                  ends: tendon.ends,
                  jackGripMm: tendon.jackGripMm,
                  shopElongationMm: tendon.shopElongationMm,
                  strandLotId: tendon.lot?.id ?? null,
                  member: tendon.member,
                  jackingForceN: tendon.jackingForceN,
                }}
              />
            </div>
          </details>
        ))}
      <Caution />
    </main>
  );
}
