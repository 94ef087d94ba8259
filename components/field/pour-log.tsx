"use client";
import dynamic from "next/dynamic";
import { useMemo, useState, useSyncExternalStore } from "react";
import { readMeta, type LocalRecord, type SessionMeta } from "@/lib/offline/db";
import {
  calibrationFor,
  currentEnds,
  provisionalVerdict,
  targetFor,
  tendonState,
  type TendonState,
  fieldTime,
  fieldDay,
} from "@/lib/offline/tendon-view";
import { awaitingRestressOf, cutClearanceOf, holdsOf, holdSummary } from "@/lib/offline/hold-view";
import { projectTimeZone } from "@/lib/format/dates";
import type { FieldEvaluation, FieldFlag, FieldTendon } from "@/lib/schemas/sync";
import { stressedEnds } from "@/lib/stressing/basis";
import { showLength, showLongLength, showPressure } from "@/lib/format/quantities";
import { Mark, type MarkLook } from "@/components/ui/mark";
import { DecisionNotices } from "./decision-notices";
import { useField } from "./field-provider";
import { GaugeCheck } from "./gauge-check";
import { PourReleaseNote } from "./pour-release-note";
import { concreteGateMet } from "@/lib/stressing/concrete-strength";
import { CutAllClear, TailCutPanel } from "./tail-cut";
import { useLiveQuery as useLive } from "dexie-react-hooks";
import { units, VerdictPanel } from "./verdict-panel";
import { countOf } from "@/lib/format/count";

// The record form and its checks (zod, react-hook-form) and the hold panel with its lift-off check
// load once a tendon is chosen, not with the tendon list; the offline worker keeps their chunks with
// the page's, so this works without signal.
const RecordForm = dynamic(() => import("./record-form").then((m) => m.RecordForm), {
  ssr: false,
  loading: () => (
    <p className="card grid min-h-[24rem] place-items-center text-ink-soft" role="status">
      Opening the record form…
    </p>
  ),
});

const HoldPanel = dynamic(() => import("./hold-panel").then((m) => m.HoldPanel), { ssr: false });

const STATE_LOOK: Record<TendonState, MarkLook> = {
  "not stressed": { icon: "M6 12h12", cls: "border-concrete-400" },
  "one end done": { icon: "M4 12h8M12 6v12", cls: "border-ink-faint bg-concrete-100" },
  done: { icon: "M5 12l4 4 10-10", cls: "border-signal-band bg-signal-band-bg text-signal-band" },
  flagged: { icon: "M6 3v18M6 4h11l-3 4 3 4H6", cls: "border-signal-stop bg-signal-stop-bg text-signal-stop" },
};

function StateMark({ state }: { state: TendonState }) {
  return (
    <Mark look={STATE_LOOK[state]} size="chip" data-state={state}>
      {state}
    </Mark>
  );
}

const subscribeToHistory = (onChange: () => void) => {
  window.addEventListener("popstate", onChange);
  return () => window.removeEventListener("popstate", onChange);
};

/** The pour and tendon named in the address (?id=…&tendon=…): the page is one cached shell for every pour. */
function useAddress(): [URLSearchParams, (tendonId: string) => void] {
  const search = useSyncExternalStore(
    subscribeToHistory,
    () => window.location.search,
    () => "",
  );
  const params = useMemo(() => new URLSearchParams(search), [search]);
  const select = (tendonId: string) => {
    const next = new URLSearchParams(window.location.search);
    next.set("tendon", tendonId);
    window.history.pushState(null, "", `?${next.toString()}`);
    window.dispatchEvent(new PopStateEvent("popstate"));
  };
  return [params, select];
}

const latestOf = (evaluations: FieldEvaluation[], tendonId: string) =>
  evaluations
    .filter((e) => e.tendonId === tendonId)
    .sort((a, b) => a.createdAt.localeCompare(b.createdAt))
    .at(-1);

export function PourLog() {
  const { db } = useField();
  const [params, selectTendon] = useAddress();
  const pourId = params.get("id");
  const selectedId = params.get("tendon");
  const [query, setQuery] = useState("");
  const [correcting, setCorrecting] = useState<LocalRecord | null>(null);
  const [justSaved, setJustSaved] = useState<string | null>(null);
  // In portrait the list folds away once a tendon is chosen, so its record form fits the screen.
  const [listOpen, setListOpen] = useState(false);

  const data = useLive(async () => {
    if (!pourId) return null;
    const pour = await db.pours.get(pourId);
    if (!pour) return null;
    const [project, tendons, records, sets, calibrations, lots, session] = await Promise.all([
      db.projects.get(pour.projectId),
      db.tendons.where("pourId").equals(pourId).sortBy("tag"),
      db.records.where("pourId").equals(pourId).toArray(),
      db.equipmentSets.where("projectId").equals(pour.projectId).sortBy("name"),
      db.calibrations.where("projectId").equals(pour.projectId).toArray(),
      db.strandLots.where("projectId").equals(pour.projectId).toArray(),
      readMeta<SessionMeta>(db, "session"),
    ]);
    const ids = tendons.map((t) => t.id);
    const [evaluations, flags, tailCuts, liftoffChecks, detensions] = await Promise.all([
      db.evaluations.where("tendonId").anyOf(ids).toArray(),
      db.flags.where("tendonId").anyOf(ids).toArray(),
      db.tailCuts.where("pourId").equals(pourId).toArray(),
      db.liftoffChecks.where("pourId").equals(pourId).toArray(),
      db.detensions.where("pourId").equals(pourId).toArray(),
    ]);
    return {
      pour,
      project,
      tendons,
      records,
      sets,
      calibrations,
      lots,
      session,
      evaluations,
      flags,
      tailCuts,
      liftoffChecks,
      detensions,
    };
  }, [db, pourId]);

  if (!pourId) return <p className="card m-4">No pour was chosen. Go back to the field log and open one.</p>;
  if (data === undefined) return <p className="m-4">Reading the tablet&apos;s storage…</p>;
  if (data === null || !data.project) {
    return (
      <div className="card m-4">
        <p>This pour is not on the tablet. Download it from the field log while you have signal.</p>
        <a className="btn-primary mt-3" href="/field">
          Back to the field log
        </a>
      </div>
    );
  }
  const { pour, project, tendons, records, sets, calibrations, lots, session, evaluations, flags, tailCuts } = data;
  const { liftoffChecks, detensions } = data;
  const recordsOf = (t: FieldTendon) => records.filter((r) => r.tendonId === t.id);
  const states = new Map(
    tendons.map((t) => [
      t.id,
      tendonState(
        t,
        recordsOf(t),
        flags.filter((f) => f.tendonId === t.id),
        latestOf(evaluations, t.id),
      ),
    ]),
  );
  const flagsOf = (t: FieldTendon) => flags.filter((f) => f.tendonId === t.id);
  // Ends a detensioned tendon waits to be stressed again at: it stays held until then.
  const awaiting = new Map(
    tendons.map((t) => [
      t.id,
      awaitingRestressOf(
        t,
        detensions.filter((d) => d.tendonId === t.id),
        recordsOf(t),
      ),
    ]),
  );
  const holdWords = new Map(
    tendons.map((t) => [
      t.id,
      holdSummary(holdsOf(flagsOf(t)), {
        liftoffChecks: liftoffChecks.filter((c) => c.tendonId === t.id),
        detensions: detensions.filter((d) => d.tendonId === t.id),
        awaitingRestress: awaiting.get(t.id),
      }),
    ]),
  );
  const cutOf = new Map(tailCuts.map((c) => [c.tendonId, c]));
  const clearance = new Map(
    tendons.map((t) => [
      t.id,
      cutClearanceOf({
        tendon: t,
        records: recordsOf(t),
        flags: flagsOf(t),
        heldOnTablet: states.get(t.id) === "flagged",
        awaitingRestress: awaiting.get(t.id),
        project,
        pour,
      }),
    ]),
  );
  const clearToCut = tendons.filter((t) => !cutOf.has(t.id) && clearance.get(t.id)!.clear);
  const timeZone = projectTimeZone(project);
  // The concrete gate in words (null when met or when the project sets no required strength).
  const concreteGate = concreteGateMet(pour.concreteStrengthMPa ?? null, project.requiredConcreteMPa ?? null)
    ? null
    : pour.concreteStrengthMPa == null
      ? `no lab results confirm the ${showPressure(units(project), project.requiredConcreteMPa!)} required yet.`
      : `confirmed ${showPressure(units(project), pour.concreteStrengthMPa)}, below the ${showPressure(units(project), project.requiredConcreteMPa!)} required.`;
  // Held tendons first, so nobody at the slab edge has to scroll to find them.
  const shown = tendons
    .filter((t) => t.tag.toLowerCase().includes(query.trim().toLowerCase()))
    .sort((a, b) => Number(states.get(b.id) === "flagged") - Number(states.get(a.id) === "flagged"));
  const selected = tendons.find((t) => t.id === selectedId) ?? null;
  const next = tendons.find(
    (t) => t.id !== selected?.id && (states.get(t.id) === "not stressed" || states.get(t.id) === "one end done"),
  );
  // A flagged tendon was stressed too: it counts with the done ones, and the header says how many wait on a decision.
  const stressedCount = [...states.values()].filter((s) => s === "done" || s === "flagged").length;
  const flaggedCount = [...states.values()].filter((s) => s === "flagged").length;

  const folded = selected && !listOpen ? "portrait:hidden" : "";

  const go = (t: FieldTendon) => {
    setCorrecting(null);
    setJustSaved(null);
    setListOpen(false);
    selectTendon(t.id);
  };

  return (
    <main className="grid gap-4 p-4 landscape:grid-cols-[15rem_minmax(0,1fr)] landscape:items-start">
      <DecisionNotices pourId={pour.id} className="landscape:col-span-2" />
      <GaugeCheck
        className="landscape:col-span-2"
        tendons={tendons}
        latest={(id) => latestOf(evaluations, id)}
        records={records}
        sets={sets}
      />
      <section
        aria-label="Tendons"
        className="grid grid-cols-[minmax(0,1fr)] gap-3 landscape:sticky landscape:top-28 landscape:max-h-[calc(100vh-8rem)] landscape:overflow-y-auto"
      >
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h1 className="text-figure font-bold">{pour.name}</h1>
          <a href="/field" className="btn-quiet">
            All pours
          </a>
        </div>
        <p className="text-ink-soft" data-testid="pour-progress">
          {project.code} · {countOf(tendons.length, "tendon")} · {stressedCount} stressed
          {flaggedCount ? ` (${flaggedCount} flagged)` : ""}
        </p>
        <PourReleaseNote pour={pour} timeZone={timeZone} />
        {concreteGate !== null && pour.release && (
          // Released: stressing is over, so the warning gives way to how the gate stood at release.
          <p className="text-ink-soft" data-testid="concrete-gate-field">
            Concrete strength at release: {concreteGate} The release stands on the engineer&apos;s statement.
          </p>
        )}
        {concreteGate !== null && !pour.release && (
          <p
            role="status"
            className="rounded-md border-2 border-signal-stop p-3 font-bold text-signal-stop"
            data-testid="concrete-gate-field"
          >
            <span aria-hidden="true">⚠ </span>
            Concrete not confirmed: do not stress.{" "}
            <span className="font-normal text-ink">
              {pour.concreteStrengthMPa == null
                ? `No lab results confirm the ${showPressure(units(project), project.requiredConcreteMPa!)} required yet.`
                : `Confirmed ${showPressure(units(project), pour.concreteStrengthMPa)}, below the ${showPressure(units(project), project.requiredConcreteMPa!)} required.`}{" "}
              Ask the inspector before the first pull; to stress anyway, the record form asks who confirmed it or why.
            </span>
          </p>
        )}
        <label htmlFor="tendon-search" className={`field-label ${folded}`}>
          Find a tendon by tag
        </label>
        <input
          id="tendon-search"
          type="search"
          className={`field-input ${folded}`}
          value={query}
          onChange={(e) => setQuery(e.target.value)}
          placeholder="e.g. U07"
          autoComplete="off"
        />
        <div className="flex flex-wrap gap-2">
          {selected && (
            <button
              type="button"
              className="btn-quiet landscape:hidden"
              aria-expanded={listOpen}
              aria-controls="tendon-list"
              onClick={() => setListOpen(!listOpen)}
            >
              {listOpen ? "Fold the tendon list" : `Change tendon (${tendons.length})`}
            </button>
          )}
          {next && (
            <button type="button" className="btn-primary" onClick={() => go(next)} data-testid="next-tendon">
              Next tendon: {next.tag}
            </button>
          )}
        </div>
        {session && (
          <CutAllClear
            projectId={pour.projectId}
            pourId={pour.id}
            clear={clearToCut}
            session={session}
            timeZone={timeZone}
          />
        )}
        {shown.length === 0 && <p className={folded}>No tendon tag contains “{query}”.</p>}
        <ul
          id="tendon-list"
          className={`grid gap-1 portrait:max-h-[34vh] portrait:overflow-y-auto ${folded}`}
          data-testid="tendon-list"
        >
          {shown.map((t) => (
            <li key={t.id}>
              <button
                type="button"
                onClick={() => go(t)}
                aria-current={t.id === selected?.id ? "true" : undefined}
                className={`flex min-h-touch w-full items-center justify-between gap-2 rounded-md border-2 px-3 text-left ${t.id === selected?.id ? "border-ink bg-concrete-100" : "border-concrete-300 bg-white"}`}
                data-testid="tendon-row"
              >
                <span className="grid">
                  <span className="font-bold wrap-anywhere">{t.tag}</span>
                  {(states.get(t.id) === "flagged" || Boolean(awaiting.get(t.id)?.length)) && (
                    <span className="text-label font-semibold text-signal-stop" data-testid="hold-summary">
                      Held · {holdWords.get(t.id) ?? "out of band on this tablet"}
                    </span>
                  )}
                  {cutOf.has(t.id) ? (
                    <span className="text-label font-semibold" data-testid="tail-state">
                      Tails cut
                    </span>
                  ) : clearance.get(t.id)!.clear ? (
                    <span className="text-label font-semibold text-signal-band" data-testid="tail-state">
                      Clear to cut tails
                    </span>
                  ) : null}
                </span>
                <StateMark state={states.get(t.id)!} />
              </button>
            </li>
          ))}
        </ul>
      </section>

      <section aria-label="Selected tendon" className="grid gap-4">
        {!selected && <p className="card">Pick a tendon from the list, or tap “Next tendon”.</p>}
        {selected && !session && (
          <p className="card">
            Sign in once with signal to record: the tablet needs to know who the operator is.{" "}
            <a className="btn-quiet" href="/sign-in?callbackUrl=/field">
              Sign in
            </a>
          </p>
        )}
        {selected && session && (
          <TendonPanel
            key={selected.id}
            tendon={selected}
            state={states.get(selected.id)!}
            project={project}
            records={recordsOf(selected)}
            sets={sets}
            calibrations={calibrations}
            lot={lots.find((l) => l.id === selected.strandLotId) ?? null}
            session={session}
            correcting={correcting}
            onCorrect={setCorrecting}
            justSaved={justSaved}
            onSaved={(id) => {
              setCorrecting(null);
              setJustSaved(id);
            }}
            next={next ?? null}
            onNext={go}
            released={Boolean(pour.release)}
            concreteGate={concreteGate}
            flags={flagsOf(selected)}
            latest={latestOf(evaluations, selected.id)}
            tailsCut={cutOf.has(selected.id)}
            tailCut={
              <TailCutPanel
                tendon={selected}
                clearance={clearance.get(selected.id)!}
                cut={cutOf.get(selected.id)}
                session={session}
                timeZone={timeZone}
              />
            }
          />
        )}
      </section>
    </main>
  );
}

function TendonPanel(props: {
  tendon: FieldTendon;
  state: TendonState;
  project: NonNullable<Parameters<typeof targetFor>[0]["project"]>;
  records: LocalRecord[];
  sets: NonNullable<Parameters<typeof targetFor>[0]["set"]>[];
  calibrations: Parameters<typeof targetFor>[0]["calibrations"];
  lot: Parameters<typeof targetFor>[0]["lot"];
  session: SessionMeta;
  correcting: LocalRecord | null;
  onCorrect: (r: LocalRecord | null) => void;
  justSaved: string | null;
  onSaved: (id: string) => void;
  next: FieldTendon | null;
  onNext: (t: FieldTendon) => void;
  /** The pour is released: nothing new is recorded until the engineer reopens it. */
  released: boolean;
  /** Why the concrete gate is not met, in words; null when it is met. */
  concreteGate: string | null;
  flags: FieldFlag[];
  /** The server's latest evaluation of the tendon, as pulled. */
  latest: FieldEvaluation | undefined;
  /** Held or clear to cut, or the cut as recorded. */
  tailCut: React.ReactNode;
  /** The tails are cut: the jack can no longer grip the tendon, so no restress is offered. */
  tailsCut: boolean;
}) {
  const { tendon, project, records, sets, calibrations, lot, session } = props;
  const u = units(project);
  const ends = currentEnds(records);
  const wanted = stressedEnds(tendon.ends);
  const allDone = wanted.every((e) => ends[e]);
  const lengthMm = tendon.segments.reduce((s, seg) => s + seg.lengthMm, 0);
  const newest = Object.values(ends).sort((a, b) => (a!.savedAt < b!.savedAt ? 1 : -1))[0] ?? null;
  // The stressing day at the site (the project's zone), as the server judges it.
  const today = fieldDay(project);
  const newestSet = newest ? (sets.find((s) => s.id === newest.equipmentSetId) ?? null) : null;
  const local = records.length
    ? provisionalVerdict({ project, tendon, lot, set: newestSet, calibrations }, records)
    : null;
  const target =
    newest && newestSet
      ? targetFor(
          { project, tendon, lot, set: newestSet, calibrations },
          calibrationFor(calibrations, newestSet.id, today).calibration,
        )
      : null;
  const [adding, setAdding] = useState(false);
  const showForm = !props.released && (Boolean(props.correcting) || adding || !allDone);

  return (
    <div
      className={
        showForm ? "grid gap-4 landscape:grid-cols-[minmax(0,1fr)_minmax(0,2fr)] landscape:items-start" : "grid gap-4"
      }
    >
      {/* Beside the form: the tendon, why it is held, the verdict so far and the tails, never scrolled away by it. */}
      <div
        className={`grid content-start gap-4 ${showForm ? "overflow-y-auto landscape:sticky landscape:top-28 landscape:max-h-[calc(100vh-10rem)] portrait:max-h-[15vh] portrait:grid-cols-2 portrait:items-start" : ""}`}
        data-testid="tendon-status"
      >
        {/* In portrait the form's title names the tendon, so the hold and the verdict come first. */}
        <header className={`card grid gap-1 p-4 ${showForm ? "portrait:order-last" : ""}`}>
          <div className="flex flex-wrap items-center gap-3">
            <h2 className="text-figure font-bold" data-testid="selected-tag">
              {tendon.tag}
            </h2>
            <StateMark state={props.state} />
          </div>
          <p>
            {tendon.strandCount} × {tendon.strandSize} strand · {showLongLength(units(project), lengthMm)} long ·
            stressed at {tendon.ends === "both" ? "both ends" : `end ${tendon.ends}`}
            {lot ? ` · lot ${lot.lotNumber}` : ""}
          </p>
        </header>

        <HoldPanel
          flags={props.flags}
          heldOnTablet={props.state === "flagged"}
          tendon={tendon}
          timeZone={projectTimeZone(project)}
        />

        {records.length > 0 && (
          <>
            {props.justSaved && (
              <p
                // Spanning two columns is only for the two-column portrait beside the form: in a one-column
                // grid a span of two makes an implicit second column and squeezes every card into it.
                className={`font-bold ${showForm ? "portrait:order-first portrait:col-span-2" : ""}`}
                role="status"
                data-testid="saved-note"
              >
                {newest?.syncState === "synced"
                  ? "Saved on this tablet and received by the server."
                  : "Saved on this tablet. It is sent when there is signal."}
              </p>
            )}
            <VerdictPanel
              project={project}
              local={local}
              // A record the server has (sent from here, or pulled) is judged by the server's latest evaluation.
              server={
                newest?.server ??
                (newest?.syncState === "synced" && props.latest
                  ? { ...props.latest, flagKinds: props.flags.filter((f) => f.status !== "closed").map((f) => f.kind) }
                  : undefined)
              }
              settled={props.state !== "flagged"}
              targetMPa={target}
              holds={holdsOf(props.flags)}
            />
            <section aria-label="Readings" className="card grid gap-2">
              <h3 className="font-bold">Readings</h3>
              {wanted.map((end) => {
                const r = ends[end];
                return (
                  <div
                    key={end}
                    className="flex flex-wrap items-center justify-between gap-2 border-t border-concrete-300 pt-2"
                    data-testid={`end-${end}`}
                  >
                    {r ? (
                      <>
                        <p>
                          End {end}: <strong>{showLength(u, r.measuredMm)}</strong> at{" "}
                          {showPressure(u, r.finalPressureMPa)} · {r.authorName} ·{" "}
                          <span data-testid="stressed-at">{fieldTime(project, r.deviceTime)}</span>
                          {r.revision > 1 ? ` · revision ${r.revision} (${r.revisionReason})` : ""} ·{" "}
                          <span data-testid="sync-state">
                            {r.syncState === "synced"
                              ? "sent"
                              : r.syncState === "pending"
                                ? "waiting to send"
                                : `needs attention (${r.syncState})`}
                          </span>
                        </p>
                        {!props.released && (
                          <button type="button" className="btn-quiet" onClick={() => props.onCorrect(r)}>
                            Correct
                          </button>
                        )}
                      </>
                    ) : (
                      <p>End {end}: not stressed yet.</p>
                    )}
                  </div>
                );
              })}
              {allDone && !adding && !props.correcting && !props.released && !props.tailsCut && (
                <button type="button" className="btn-quiet w-fit" onClick={() => setAdding(true)}>
                  Record a restress
                </button>
              )}
            </section>
          </>
        )}

        {records.length > 0 && props.tailCut}

        {props.justSaved && props.next && !props.correcting && (
          <button type="button" className="btn-primary" onClick={() => props.onNext(props.next!)}>
            Next tendon: {props.next.tag}
          </button>
        )}

        {props.released && (
          <p className="card font-semibold" data-testid="record-refused">
            The pour is released: this tablet saves no record for {tendon.tag} until the engineer of record reopens it.
          </p>
        )}
      </div>

      {showForm && (
        <RecordForm
          key={`${tendon.id}-${props.correcting?.id ?? "new"}-${records.length}`}
          ctx={{ project, tendon, lot, calibrations }}
          sets={sets}
          session={session}
          records={records}
          correcting={props.correcting}
          onSaved={(id) => {
            setAdding(false);
            props.onSaved(id);
          }}
          onCancel={props.correcting || adding ? () => (props.onCorrect(null), setAdding(false)) : undefined}
          concreteGate={props.concreteGate}
        />
      )}
    </div>
  );
}
