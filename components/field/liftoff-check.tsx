"use client";
import { typedPressure } from "@/lib/format/quantities";
import { FormField } from "@/components/ui/form-field";
import { useId, useState } from "react";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import { readMeta, type LocalLiftoffCheck, type SessionMeta } from "@/lib/offline/db";
import type { Hold } from "@/lib/offline/hold-view";
import { saveLiftoffCheck } from "@/lib/offline/outbox";
import { calibrationFor, calibrationLine, fieldDay } from "@/lib/offline/tendon-view";
import { liftoffPayloadSchema, type LiftoffPayload } from "@/lib/schemas/liftoff";
import { entryUnitsFor } from "@/lib/schemas/record";
import type { FieldProject, FieldTendon } from "@/lib/schemas/sync";
import { zodFields } from "@/lib/schemas/zod-fields";
import { stressedEnds } from "@/lib/stressing/basis";
import { liftoffLine, liftoffPressureProblem } from "@/lib/stressing/liftoff";
import { isInputError, parsePressure } from "@/lib/units";
import {
  FollowUpActions,
  type FollowUpNames,
  type FollowUpOrder,
  FollowUpPanel,
  FormProblem,
  Problem,
  SetChoice,
  saveFailure,
} from "./follow-up-fields";
import { useField } from "./field-provider";
import { useLiveQuery as useLive } from "dexie-react-hooks";
import { ClientForm } from "@/components/ui/client-form";

/**
 * The lift-off check an engineer ordered, opened from the hold panel: the crew records the gauge
 * pressure at which the wedges lift off, the end and the equipment set; who and when are the
 * person signed in and now. Saved on the tablet with its outbox op and sent with the next sync;
 * the server converts the pressure on the calibration and judges it against the force expected
 * at the anchor after seating. The tablet refuses what it can already tell is wrong (an
 * unreadable pressure, one outside the set's calibrated range, a set without a calibration in
 * force) and saves nothing then.
 */

type Field = "tendonEnd" | "equipmentSetId" | "pressure";

const LIFTOFF_CHECK: FollowUpNames = {
  title: "Lift-off check",
  what: "the lift-off check",
  testId: "liftoff-check",
  openTestId: "liftoff-open",
};

export function LiftoffCheckPanel({ tendon, hold }: { tendon: FieldTendon; hold: Hold }) {
  const { db } = useField();
  const dispositionId = hold.decision?.id;
  const data = useLive(async () => {
    const [project, sets, calibrations, checks, session] = await Promise.all([
      db.projects.get(tendon.projectId),
      db.equipmentSets.where("projectId").equals(tendon.projectId).sortBy("name"),
      db.calibrations.where("projectId").equals(tendon.projectId).toArray(),
      db.liftoffChecks.where("tendonId").equals(tendon.id).sortBy("checkedAt"),
      readMeta<SessionMeta>(db, "session"),
    ]);
    return { project, sets, calibrations, checks: checks.filter((c) => c.dispositionId === dispositionId), session };
  }, [db, tendon.id, tendon.projectId, dispositionId]);

  if (!data?.project) return null;
  const { project, checks } = data;
  const timeZone = projectTimeZone(project);

  return (
    <FollowUpPanel
      names={LIFTOFF_CHECK}
      dispositionId={dispositionId}
      session={data.session}
      recorded={checks.length}
      form={(order) => (
        <LiftoffForm tendon={tendon} {...order} project={project} sets={data.sets} calibrations={data.calibrations} />
      )}
    >
      {checks.length > 0 && (
        <ul className="grid gap-2" data-testid="liftoff-results">
          {checks.map((c) => (
            <LiftoffResult key={c.id} check={c} project={project} timeZone={timeZone} />
          ))}
        </ul>
      )}
    </FollowUpPanel>
  );
}

function LiftoffResult(props: { check: LocalLiftoffCheck; project: FieldProject; timeZone: string }) {
  const { check: c, project } = props;
  const judged =
    c.withinBand !== undefined &&
    c.liftoffForceN !== undefined &&
    c.expectedForceN !== undefined &&
    c.deviationPct !== undefined &&
    c.bandPct !== undefined;
  const typed = typedPressure(c.entered);
  return (
    <li
      className={`grid gap-1 rounded-md border-2 bg-white p-3 ${
        !judged ? "border-concrete-500" : c.withinBand ? "border-signal-band" : "border-signal-stop"
      }`}
      data-testid="liftoff-result"
      data-within={judged ? String(c.withinBand) : "pending"}
    >
      <p className="font-semibold">
        End {c.tendonEnd} · gauge {typed} · by {c.checkedByName}, {formatDateTime(c.checkedAt, props.timeZone)}
      </p>
      {judged ? (
        <p className={`flex items-start gap-2 font-bold ${c.withinBand ? "text-signal-band" : "text-signal-stop"}`}>
          <svg viewBox="0 0 24 24" className="mt-0.5 h-6 w-6 shrink-0" aria-hidden="true">
            <path
              d={c.withinBand ? "M5 12l4 4 10-10" : "M12 4v10M12 18v2"}
              fill="none"
              stroke="currentColor"
              strokeWidth="3"
              strokeLinecap="round"
            />
          </svg>
          <span data-testid="liftoff-verdict">
            {c.withinBand ? "Within band" : "Outside band: the engineer is told"}.{" "}
            {liftoffLine(project, {
              liftoffForceN: c.liftoffForceN!,
              expectedForceN: c.expectedForceN!,
              deviationPct: c.deviationPct!,
              bandPct: c.bandPct!,
              withinBand: c.withinBand!,
            })}
          </span>
        </p>
      ) : (
        <p data-testid="liftoff-verdict">
          {c.syncState === "pending"
            ? "Saved on this tablet, waiting to send. The server judges it on arrival."
            : `Needs attention (${c.syncState}): see “Needs attention” on the field log.`}
        </p>
      )}
      <p className="text-ink-soft">Do not cut tails: the engineer of record decides on this tendon next.</p>
    </li>
  );
}

function LiftoffForm(
  props: FollowUpOrder<SessionMeta> & {
    tendon: FieldTendon;
    project: FieldProject;
    sets: { id: string; name: string; gaugeSerial: string }[];
    calibrations: Parameters<typeof calibrationFor>[0];
  },
) {
  const { db } = useField();
  const { tendon, project, sets, calibrations, session } = props;
  const ends = stressedEnds(tendon.ends);
  const unit = entryUnitsFor(project.unitSystem).pressure;
  const today = fieldDay(project);
  const [end, setEnd] = useState<"A" | "B" | "">(ends.length === 1 ? ends[0]! : "");
  const [setId, setSetId] = useState(sets.length === 1 ? sets[0]!.id : "");
  const [pressure, setPressure] = useState("");
  const [errors, setErrors] = useState<Partial<Record<Field | "root", string>>>({});
  const [busy, setBusy] = useState(false);
  const ids = { end: useId(), set: useId(), pressure: useId() };

  const submit = async (event: React.FormEvent) => {
    event.preventDefault();
    const found: Partial<Record<Field | "root", string>> = {};
    if (!end) found.tendonEnd = "Choose the end the lift-off was read at.";
    let pressureMPa: number | null = null;
    if (!pressure.trim()) found.pressure = "Type the gauge pressure at lift-off.";
    else {
      try {
        pressureMPa = parsePressure(pressure, { field: "pressure", system: "SI", defaultUnit: unit });
      } catch (e) {
        if (!isInputError(e)) throw e;
        found.pressure = `“${pressure}” cannot be read as a pressure. Type a number, e.g. ${unit === "psi" ? "4200" : "29.0"}.`;
      }
    }
    if (!setId) found.equipmentSetId = "Choose the equipment set used.";
    else {
      const { calibration, expired } = calibrationFor(calibrations, setId, today);
      if (!calibration)
        found.equipmentSetId = "This set has no calibration in force today: its gauge cannot give a force.";
      else if (expired)
        found.equipmentSetId = `This set's calibration expired on ${calibration.validUntil}: use a calibrated set.`;
      else if (pressureMPa !== null) {
        const problem = liftoffPressureProblem(project, calibrationLine(calibration), pressureMPa);
        if (problem) found.pressure = problem.message;
      }
    }
    const payload: LiftoffPayload = {
      projectId: tendon.projectId,
      pourId: tendon.pourId,
      tendonId: tendon.id,
      dispositionId: props.dispositionId,
      tendonEnd: (end || "A") as "A" | "B",
      equipmentSetId: setId,
      pressure: pressure.trim(),
      pressureUnit: unit,
      checkedAt: new Date().toISOString(),
      authorUserId: session.userId,
    };
    if (!Object.keys(found).length) {
      const parsed = liftoffPayloadSchema.safeParse(payload);
      if (!parsed.success)
        for (const [field, messages] of Object.entries(zodFields(parsed.error)))
          found[(["tendonEnd", "equipmentSetId", "pressure"].includes(field) ? field : "root") as Field | "root"] =
            messages.join(" ");
    }
    setErrors(found);
    if (Object.keys(found).length || pressureMPa === null) return;
    setBusy(true);
    try {
      await saveLiftoffCheck(db, { payload, pressureMPa, authorName: session.name });
      props.onDone(true);
    } catch (e) {
      setErrors({ root: saveFailure(e, "the lift-off check") });
    } finally {
      setBusy(false);
    }
  };

  return (
    <ClientForm className="grid gap-4" onSubmit={(e) => void submit(e)} noValidate data-testid="liftoff-form">
      <FormProblem message={errors.root} />
      <fieldset aria-describedby={errors.tendonEnd ? `${ids.end}-error` : undefined}>
        <legend className="field-label">End</legend>
        <div className="mt-1 flex flex-wrap gap-2">
          {ends.map((e) => (
            <label key={e} className="btn-quiet has-checked:bg-ink has-checked:text-concrete-50">
              <input
                type="radio"
                name="liftoff-end"
                value={e}
                className="sr-only"
                checked={end === e}
                onChange={() => setEnd(e)}
              />
              End {e}
            </label>
          ))}
        </div>
        <Problem id={`${ids.end}-error`} message={errors.tendonEnd} />
      </fieldset>

      <SetChoice
        name="liftoff-set"
        sets={sets}
        value={setId}
        onChange={setSetId}
        errorId={`${ids.set}-error`}
        error={errors.equipmentSetId}
      />

      <FormField
        id={ids.pressure}
        label={`Gauge pressure at lift-off (${unit})`}
        className="text-lead"
        numeric
        value={pressure}
        onChange={(e) => setPressure(e.target.value)}
        data-testid="liftoff-pressure"
        error={errors.pressure}
        announce
      />

      <p>
        Checked by <strong>{session.name}</strong>, now. Read the gauge the moment the wedges lift off the anchor plate.
      </p>
      <FollowUpActions
        busy={busy}
        saveLabel="Save lift-off check"
        saveTestId="liftoff-save"
        onCancel={() => props.onDone(false)}
      />
    </ClientForm>
  );
}
