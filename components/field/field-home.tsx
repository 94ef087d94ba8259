"use client";
import { useEffect, useState } from "react";
import { readMeta, type SessionMeta } from "@/lib/offline/db";
import type { AvailablePour } from "@/lib/schemas/sync";

/** A released pour: the engineer's statement is in; the crew may cut tails or grout. */
function ReleasedMark() {
  return (
    <p className="inline-flex items-center gap-2 font-bold text-signal-band" data-testid="pour-released">
      <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true">
        <path d="M5 12l4 4 10-10" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
      </svg>
      Released: tails may be cut or ducts grouted
    </p>
  );
}
import { AttentionList } from "./attention-list";
import { DecisionNotices } from "./decision-notices";
import { useField } from "./field-provider";
import { useLiveQuery as useLive } from "dexie-react-hooks";
import { clockTime, useNow } from "./use-live";
import { countOf } from "@/lib/format/count";
import { dayInZone, formatDateTime, formatShortAge, projectTimeZone, shiftDay } from "@/lib/format/dates";
import { orderPoursForCrew } from "@/lib/format/pour-order";

/** The crew's landing: pours ready offline with what they hold, and pours to take out. */
export function FieldHome() {
  const { db, client } = useField();
  const now = useNow();
  const session = useLive(() => readMeta<SessionMeta>(db, "session"), [db]);
  const ready = useLive(async () => {
    const [pours, projects] = await Promise.all([db.pours.toArray(), db.projects.toArray()]);
    // The crew's order, as on the server's list: today's on site first, then coming, past, undated.
    const zoneOf = new Map(projects.map((p) => [p.id, projectTimeZone(p)]));
    const at = Date.now();
    const ordered = orderPoursForCrew(pours, (pour) => dayInZone(at, zoneOf.get(pour.projectId) ?? "UTC"));
    return Promise.all(
      ordered.map(async (pour) => {
        const tendons = await db.tendons.where("pourId").equals(pour.id).toArray();
        const records = await db.records.where("pourId").equals(pour.id).toArray();
        const sets = await db.equipmentSets.where("projectId").equals(pour.projectId).toArray();
        const calibrations = await db.calibrations.where("projectId").equals(pour.projectId).toArray();
        const lots = await db.strandLots.where("projectId").equals(pour.projectId).count();
        const project = await db.projects.get(pour.projectId);
        const stressed = new Set(records.map((r) => r.tendonId)).size;
        return { pour, project, tendons: tendons.length, stressed, sets, calibrations, lots };
      }),
    );
  }, [db]);

  const [available, setAvailable] = useState<AvailablePour[] | null>(null);
  const [listError, setListError] = useState<string | null>(null);
  const [downloading, setDownloading] = useState<string | null>(null);
  const [downloadError, setDownloadError] = useState<string | null>(null);

  const [listVersion, setListVersion] = useState(0);
  useEffect(() => {
    let cancelled = false;
    void client.availablePours().then((answer) => {
      if (cancelled) return;
      setListError(answer.error);
      if (answer.pours) setAvailable(answer.pours);
    });
    const again = () => setListVersion((v) => v + 1);
    window.addEventListener("online", again);
    return () => {
      cancelled = true;
      window.removeEventListener("online", again);
    };
  }, [client, listVersion]);

  async function download(pourId: string) {
    setDownloading(pourId);
    setDownloadError(null);
    const result = await client.download(pourId);
    setDownloading(null);
    if (!result.ok)
      setDownloadError(result.status === 401 ? "Sign in again to download." : `Could not download: ${result.message}`);
  }

  const readyIds = new Set(ready?.map((r) => r.pour.id));

  // The page's heading and lead come from the server (app/(field)/field/page.tsx); this fills in below them.
  return (
    <>
      <div>
        <p className="text-lead" data-testid="operator">
          {session === undefined
            ? "Checking who is signed in…"
            : session
              ? `Operator: ${session.name}`
              : "Nobody is signed in on this tablet yet."}
        </p>
        {session === null && (
          <a className="btn-primary mt-3" href="/sign-in?callbackUrl=/field">
            Sign in
          </a>
        )}
        <a className="btn-quiet mt-3" href="/field/sign">
          Sign reports (inspector, needs signal)
        </a>
      </div>

      <DecisionNotices />

      <AttentionList />

      <section aria-labelledby="ready-heading" className="grid gap-3">
        <h2 id="ready-heading" className="text-lead font-bold">
          Ready offline
        </h2>
        {ready === undefined && <p>Reading the tablet&apos;s storage…</p>}
        {ready?.length === 0 && (
          <p className="card">No pours on this tablet yet. Take one out below while you have signal.</p>
        )}
        <ul className="grid gap-4 md:grid-cols-2">
          {ready?.map(({ pour, project, tendons, stressed, sets, calibrations, lots }) => {
            // Today and tomorrow at the site, in the project's zone, not the tablet's.
            const today = dayInZone(now, projectTimeZone(project ?? {}));
            const tomorrow = shiftDay(today, 1);
            const warnings = sets.flatMap((set) => {
              const current = calibrations
                .filter((c) => c.equipmentSetId === set.id)
                .sort((a, b) => b.calibratedOn.localeCompare(a.calibratedOn))[0];
              if (!current) return [`${set.name} has no calibration: a reason is needed to use it.`];
              if (current.validUntil < today)
                return [`${set.name}: calibration expired on ${current.validUntil}; a reason is needed to use it.`];
              if (current.validUntil <= tomorrow)
                return [`${set.name}: calibration runs out on ${current.validUntil}, during or just after this shift.`];
              return [];
            });
            return (
              <li key={pour.id} className="card grid gap-2" data-testid="ready-pour">
                <div className="flex flex-wrap items-baseline justify-between gap-2">
                  <h3 className="text-lead font-bold">{pour.name}</h3>
                  <span className="text-label font-semibold uppercase text-ink-faint">
                    {project ? `${project.code} · ${project.name}` : ""}
                  </span>
                </div>
                {pour.release || pour.status === "released" ? <ReleasedMark /> : null}
                {!pour.release && pour.reopened && (
                  <p className="font-semibold text-signal-stop" data-testid="pour-reopened">
                    Reopened by {pour.reopened.by}: {pour.reopened.reason}
                  </p>
                )}
                <p className="inline-flex items-center gap-2 font-bold text-signal-band" data-testid="ready-offline">
                  <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true">
                    <path d="M5 12l4 4 10-10" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
                  </svg>
                  Ready offline
                </p>
                <p data-testid="ready-counts">
                  {countOf(tendons, "tendon")} ({stressed} with records) · {countOf(sets.length, "equipment set")} ·{" "}
                  {countOf(calibrations.length, "calibration")} · {countOf(lots, "strand lot")}
                </p>
                <p className="text-ink-soft" data-testid="ready-age">
                  Data from{" "}
                  {project ? formatDateTime(pour.downloadedAt, projectTimeZone(project)) : clockTime(pour.downloadedAt)}{" "}
                  ({formatShortAge(pour.downloadedAt, now)}), kept up to date at each sync.
                </p>
                {pour.unavailable && (
                  <p className="font-bold text-signal-stop">
                    The server no longer lists this pour for you; records already made here are still sent.
                  </p>
                )}
                {warnings.map((w) => (
                  <p
                    key={w}
                    role="alert"
                    className="flex gap-2 rounded-md bg-signal-stop-bg p-2 font-semibold text-signal-stop"
                    data-testid="calibration-warning"
                  >
                    <svg viewBox="0 0 24 24" className="mt-1 h-5 w-5 shrink-0" aria-hidden="true">
                      <path
                        d="M12 2 L23 21 H1 Z M12 9 V14 M12 17 V18"
                        fill="none"
                        stroke="currentColor"
                        strokeWidth="2.5"
                        strokeLinejoin="round"
                      />
                    </svg>
                    {w}
                  </p>
                ))}
                <div className="flex flex-wrap gap-2">
                  <a className="btn-primary" href={`/field/pour?id=${pour.id}`}>
                    Open tendon list
                  </a>
                  <button
                    type="button"
                    className="btn-quiet"
                    disabled={downloading === pour.id}
                    onClick={() => void download(pour.id)}
                  >
                    {downloading === pour.id ? "Refreshing…" : "Refresh now"}
                  </button>
                </div>
              </li>
            );
          })}
        </ul>
      </section>

      <section aria-labelledby="take-heading" className="grid gap-3">
        <h2 id="take-heading" className="text-lead font-bold">
          Take pours out
        </h2>
        {downloadError && (
          <p role="alert" className="font-semibold text-signal-stop">
            {downloadError}
          </p>
        )}
        {listError && <p className="card">{listError}</p>}
        {!listError && available === null && <p>Asking the server for your pours…</p>}
        {available?.length === 0 && <p className="card">There are no pours on your crew&apos;s projects yet.</p>}
        <ul className="grid gap-3 md:grid-cols-2">
          {available?.map((p) => (
            <li
              key={p.id}
              className="card flex flex-wrap items-center justify-between gap-3"
              data-testid="available-pour"
            >
              <div>
                <p className="font-bold">{p.name}</p>
                <p className="text-ink-soft">
                  {p.projectCode} · {countOf(p.tendonCount, "tendon")}
                  {p.plannedStressingDate ? ` · stressing ${p.plannedStressingDate}` : ""}
                </p>
                {p.status === "released" && <ReleasedMark />}
              </div>
              <button
                type="button"
                className="btn-primary"
                disabled={downloading === p.id}
                onClick={() => void download(p.id)}
              >
                {downloading === p.id ? "Downloading…" : readyIds.has(p.id) ? "Download again" : `Download ${p.name}`}
              </button>
            </li>
          ))}
        </ul>
      </section>
    </>
  );
}
