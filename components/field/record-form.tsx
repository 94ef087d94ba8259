"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useMemo, useState } from "react";
import {
  get,
  useFieldArray,
  useForm,
  useWatch,
  type FieldError as HookFieldError,
  type UseFormRegisterReturn,
} from "react-hook-form";
import { uuidv7 } from "uuidv7";
import type { LocalRecord, SessionMeta } from "@/lib/offline/db";
import { saveRecord } from "@/lib/offline/outbox";
import { calibrationFor, fieldDay, provisionalVerdict, targetFor, type TendonContext } from "@/lib/offline/tendon-view";
import {
  EMPTY_RECORD_FORM,
  entryUnitsFor,
  MAX_GAUGE_STEPS,
  payloadFromForm,
  recordFormSchema,
  recordPayloadSchema,
  type Entered,
  type RecordFormValues,
  WIRE_BREAK_PLACE_WORDS,
  WIRE_BREAK_PLACES,
} from "@/lib/schemas/record";
import { stressedEnds } from "@/lib/stressing/basis";
import { finerDivision, showPressure } from "@/lib/stressing/display";
import { PER, shown } from "@/lib/client/unit-fields";
import { showPct } from "@/lib/format/quantities";
import { setFormDirty } from "./form-dirty";
import { SafetyCaution } from "@/components/ui/caution";
import { fieldAria, FormField } from "@/components/ui/form-field";
import { FieldError } from "@/components/ui/form-message";
import { FractionKeys, withFraction } from "@/components/ui/fraction-keys";
import { useField } from "./field-provider";
import { PhotoPicker, type PickedPhoto } from "./photo-picker";
import { units } from "./verdict-panel";
import { ClientForm } from "@/components/ui/client-form";

/**
 * The message under a group of choices (a fieldset), read out as it appears: the group points at
 * it with `aria-describedby={groupError(id, message)}`.
 */
function GroupError({ id, message }: { id: string; message?: string }) {
  return <FieldError id={`${id}-error`} messages={message ? [message] : undefined} alert />;
}
const groupError = (id: string, message?: string) => (message ? `${id}-error` : undefined);

/** A reading box the fraction keys write into. */
type LengthBox =
  | "marksBefore"
  | "marksAfter"
  | "seating"
  | "drawIn"
  | "rereadMarksAfter"
  | `strokes.${number}.value`
  | `rereadStrokes.${number}.value`
  | `gaugeSteps.${number}.reading`;

function NumberBox(props: {
  id: string;
  label: string;
  unit: string;
  reg: UseFormRegisterReturn;
  error?: string;
  hint?: string;
  numeric?: boolean;
  onFocus?: () => void;
}) {
  return (
    <div className="grid content-end">
      <label htmlFor={props.id} className="field-label">
        {props.label} <span className="normal-case">({props.unit})</span>
      </label>
      <input
        type="text"
        inputMode={props.numeric ? "numeric" : "decimal"}
        autoComplete="off"
        className="field-input text-lead tabular-nums"
        {...fieldAria(props.id, { hint: props.hint, error: props.error })}
        placeholder={props.hint}
        onFocus={props.onFocus}
        {...props.reg}
      />
      {props.hint && (
        <span id={`${props.id}-hint`} className="sr-only">
          {props.hint}
        </span>
      )}
      <FieldError id={`${props.id}-error`} messages={props.error ? [props.error] : undefined} alert />
    </div>
  );
}

/** A choice among a few, as big pressable chips (the radio itself is hidden, its label is the key). */
const CHIP = "btn-quiet has-checked:bg-ink has-checked:text-concrete-50";

/** A box as typed, else its SI value shown in the record's entry units (steps saved by older apps). */
const typedOr = (typed: string | undefined, si: number | undefined, show: (value: number) => string) =>
  typed ?? (si === undefined ? "" : show(si));

function formFromEntered(base: LocalRecord): RecordFormValues {
  const e = base.entered as Entered;
  return {
    ...EMPTY_RECORD_FORM,
    tendonEnd: base.tendonEnd,
    equipmentSetId: base.equipmentSetId,
    expiredCalibrationReason: base.expiredCalibrationReason ?? "",
    concreteGoAhead: base.concreteGoAhead ?? "",
    readingMethod: base.readingMethod,
    initialPressure: e.initialPressure ?? "",
    finalPressure: e.finalPressure,
    marksBefore: e.marks?.before ?? "",
    marksAfter: e.marks?.after ?? "",
    strokes: e.strokes?.length ? e.strokes.map((value) => ({ value })) : [{ value: "" }],
    seating: e.seating ?? "",
    drawIn: e.drawIn ?? "",
    rereadMarksAfter: e.reread?.marksAfter ?? "",
    rereadStrokes: (e.reread?.strokes ?? []).map((value) => ({ value })),
    rereadDeclinedReason: base.rereadDeclinedReason ?? "",
    // Steps typed on a tablet carry their text; older ones only their SI values, shown in the entry units.
    gaugeSteps: (e.gaugeSteps ?? []).map((st) => ({
      pressure: typedOr(st.pressure, st.pressureMPa, (mpa) =>
        e.units.pressure === "psi" ? shown(mpa, PER.psi, 0) : shown(mpa, PER.MPa, 2),
      ),
      reading: typedOr(st.reading, st.readingMm, (mm) =>
        e.units.length === "in" ? shown(mm, PER.in, 4) : shown(mm, PER.mm, 1),
      ),
    })),
    stressingOrder: base.stressingOrder ?? "sequential",
    wireBreaks: String(base.wireBreaks),
    wireBreakDetails: (base.wireBreakDetails ?? []).map((b) => ({
      strand: b.strand === null ? "" : String(b.strand),
      strandNotKnown: b.strand === null,
      where: b.where,
    })),
    remarks: base.remarks ?? "",
  };
}

export function RecordForm({
  ctx,
  sets,
  session,
  records,
  correcting,
  onSaved,
  onCancel,
  concreteGate = null,
}: {
  ctx: Omit<TendonContext, "set">;
  sets: TendonContext["set"][];
  session: SessionMeta;
  records: LocalRecord[];
  correcting: LocalRecord | null;
  onSaved: (recordId: string) => void;
  onCancel?: () => void;
  /** Why the pour's concrete gate is not met, in words; null when it is met or the project sets none. */
  concreteGate?: string | null;
}) {
  const { db, sendSaved } = useField();
  const entryUnits = entryUnitsFor(ctx.project.unitSystem);
  // The stressing day in the project's time zone, the day the server judges the calibration on.
  const today = fieldDay(ctx.project);
  const ends = stressedEnds(ctx.tendon.ends);
  const doneEnds = new Set(records.filter((r) => !r.supersededBy).map((r) => r.tendonEnd));
  const expiredSetIds = useMemo(
    () => sets.filter((s) => s && calibrationFor(ctx.calibrations, s.id, today).expired).map((s) => s!.id),
    [sets, ctx.calibrations, today],
  );
  const concreteUnconfirmed = concreteGate !== null;
  // The reading division alone could change the verdict: the finer second reading is asked before saving.
  const [rereadAsked, setRereadAsked] = useState(
    Boolean(correcting?.firstReadingMm || correcting?.rereadDeclinedReason),
  );
  const schema = useMemo(
    () =>
      recordFormSchema({
        units: entryUnits,
        expiredSetIds,
        ends,
        correction: Boolean(correcting),
        concreteUnconfirmed,
        rereadAsked,
        strandCount: ctx.tendon.strandCount,
      }),
    [entryUnits, expiredSetIds, ends, correcting, concreteUnconfirmed, rereadAsked, ctx.tendon.strandCount],
  );
  // A set with no calibration on file gives no force: it is not offered (a correction keeps its own).
  const offered = sets.filter(
    (s) => calibrationFor(ctx.calibrations, s!.id, today).calibration || s!.id === correcting?.equipmentSetId,
  );
  const notOffered = sets.length - offered.length;
  const defaults = useMemo<RecordFormValues>(
    () =>
      correcting
        ? formFromEntered(correcting)
        : {
            ...EMPTY_RECORD_FORM,
            tendonEnd: ends.find((e) => !doneEnds.has(e)) ?? ends[0]!,
            equipmentSetId: offered.length === 1 ? offered[0]!.id : "",
            // Asked once per tendon: the other end's record, else the schedule, else one end after the other.
            stressingOrder:
              records.find((r) => r.stressingOrder)?.stressingOrder ?? ctx.tendon.stressingOrder ?? "sequential",
            // The project's comparison basis is the form's default reading method.
            readingMethod: ctx.project.comparisonBasis === "gross" ? "strokes" : "marks",
          },
    // Defaults are taken once per tendon and mode.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [correcting?.id, ctx.tendon.id],
  );
  const form = useForm<RecordFormValues>({ resolver: zodResolver(schema), defaultValues: defaults, mode: "onSubmit" });
  const { register, handleSubmit, setValue, getValues, formState, reset, control } = form;
  const strokes = useFieldArray({ control, name: "strokes" });
  const stepRows = useFieldArray({ control, name: "gaugeSteps" });
  // One row per broken wire, following the count typed.
  const breakRows = useFieldArray({ control, name: "wireBreakDetails" });
  const breakCount = useWatch({ control, name: "wireBreaks" });
  useEffect(() => {
    const wanted = /^\d{1,2}$/.test(breakCount ?? "") ? Number(breakCount) : 0;
    const have = breakRows.fields.length;
    if (wanted > have)
      breakRows.append(
        Array.from({ length: wanted - have }, () => ({ strand: "", strandNotKnown: false, where: "" as const })),
      );
    else if (wanted < have) breakRows.remove(Array.from({ length: have - wanted }, (_, i) => wanted + i));
  }, [breakCount, breakRows]);
  const [photos, setPhotos] = useState<PickedPhoto[]>([]);
  const [saveError, setSaveError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  // A final pressure farther from the target than the band asks for a reason before it is saved.
  const [offTarget, setOffTarget] = useState<{ pct: number; reason: string } | null>(
    (correcting?.entered as Entered | undefined)?.gaugeOffTarget ?? null,
  );

  useEffect(() => setFormDirty(formState.isDirty || photos.length > 0), [formState.isDirty, photos.length]);
  useEffect(() => () => setFormDirty(false), []);

  const setId = useWatch({ control, name: "equipmentSetId" });
  const method = useWatch({ control, name: "readingMethod" });
  const rereadStrokes = useWatch({ control, name: "rereadStrokes" });
  const set = sets.find((s) => s?.id === setId) ?? null;
  const { calibration, expired } = calibrationFor(ctx.calibrations, setId, today);
  const targetMPa = set ? targetFor({ ...ctx, set }, calibration) : null;
  const blind = ctx.project.blindEntry;
  const inches = entryUnits.length === "in";
  const err = formState.errors;

  async function submit(values: RecordFormValues) {
    setSaving(true);
    setSaveError(null);
    try {
      const recordId = uuidv7();
      const cal = calibrationFor(ctx.calibrations, values.equipmentSetId, today);
      const target = cal.calibration
        ? targetFor({ ...ctx, set: sets.find((s) => s?.id === values.equipmentSetId) ?? null }, cal.calibration)
        : null;
      const payload = payloadFromForm(values, {
        units: entryUnits,
        projectId: ctx.project.id,
        pourId: ctx.tendon.pourId,
        tendonId: ctx.tendon.id,
        chainId: correcting ? correcting.chainId : recordId,
        revision: correcting ? correcting.revision + 1 : 1,
        baseRecordId: correcting?.id ?? null,
        calibrationId: cal.calibration?.id ?? null,
        expired: cal.expired,
        twoEnds: ends.length === 2,
        concreteUnconfirmed,
        authorUserId: session.userId,
        now: new Date(),
        timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC",
      });
      // A gauge reading the calibration does not cover gives no known force: refused, never judged.
      // Each pressure is named by its box: the initial, the final, and every gauge step.
      if (cal.calibration) {
        const { minPressureMPa: lo, maxPressureMPa: hi } = cal.calibration;
        const range = `the calibrated range ${showPressure(units(ctx.project), lo)} to ${showPressure(units(ctx.project), hi)} of this set`;
        const outside = (mpa: number | null | undefined) => mpa !== null && mpa !== undefined && (mpa < lo || mpa > hi);
        let refused = false;
        if (outside(payload.finalPressureMPa)) {
          form.setError("finalPressure", {
            message: `Final gauge pressure outside ${range}: read the gauge again.`,
          });
          refused = true;
        }
        if (outside(payload.initialPressureMPa)) {
          form.setError("initialPressure", {
            message: `Initial gauge pressure outside ${range}: the force there is not known.`,
          });
          refused = true;
        }
        const typedRows = values.gaugeSteps.flatMap((st, i) => (st.pressure !== "" || st.reading !== "" ? [i] : []));
        (payload.entered.gaugeSteps ?? []).forEach((st, k) => {
          const row = typedRows[k] ?? k;
          if (outside(st.pressureMPa)) {
            form.setError(`gaugeSteps.${row}.pressure`, {
              message: `Step ${row + 1} pressure outside ${range}: the force there is not known.`,
            });
            refused = true;
          }
        });
        if (refused) return;
      }
      const offPct = target ? ((payload.finalPressureMPa - target) / target) * 100 : 0;
      if (Math.abs(offPct) > ctx.project.tolerancePct) {
        if (!offTarget || offTarget.reason.trim().length < 3) {
          setOffTarget({ pct: offPct, reason: offTarget?.reason ?? "" });
          setSaveError(
            `The final pressure is ${showPct(offPct)} from the target ${showPressure(units(ctx.project), target!)}: read the gauge again, or say why below and save again.`,
          );
          return;
        }
        // Kept as a field of the record (schema-checked on the server), not in the remarks.
        payload.entered.gaugeOffTarget = {
          pct: Math.round(offPct * 100) / 100,
          reason: offTarget.reason.trim().slice(0, 500),
        };
      }
      // The same check the server makes, before anything is stored.
      const checked = recordPayloadSchema.safeParse(payload);
      if (!checked.success) throw new Error(checked.error.issues.map((i) => i.message).join(" "));
      const chosen = sets.find((s) => s?.id === values.equipmentSetId) ?? null;
      const draft = {
        ...payload,
        id: recordId,
        syncState: "pending",
        authorName: session.name,
        savedAt: payload.deviceTime,
        supersededBy: null,
      } as LocalRecord;
      const local = provisionalVerdict({ ...ctx, set: chosen }, [
        ...records.filter((r) => r.id !== correcting?.id),
        draft,
      ]);
      // The division alone could flip the verdict and this end was not read again: ask before it is final.
      if (local?.reread && !payload.firstReadingMm && !payload.rereadDeclinedReason) {
        if (values.readingMethod === "strokes")
          setValue(
            "rereadStrokes",
            values.strokes.filter((s) => s.value !== "").map(() => ({ value: "" })),
          );
        setRereadAsked(true);
        setFractionTarget(values.readingMethod === "marks" ? "rereadMarksAfter" : "rereadStrokes.0.value");
        // Bring the new step above the sticky Save row (landscape puts it below the fold).
        requestAnimationFrame(() =>
          document.querySelector('[data-testid="reread-step"]')?.scrollIntoView({ block: "center" }),
        );
        setSaveError(
          `Not saved yet: the reading division alone could change the verdict. Read the elongation again to ${finerDivision(units(ctx.project))} below, or say why it cannot be read again.`,
        );
        return;
      }
      await saveRecord(db, {
        recordId,
        payload,
        authorName: session.name,
        local,
        photos: photos.map(({ url, ...p }) => (void url, p)),
      });
      photos.forEach((p) => URL.revokeObjectURL(p.url));
      setPhotos([]);
      setOffTarget(null);
      setRereadAsked(false);
      reset(defaults);
      setFormDirty(false);
      onSaved(recordId);
      sendSaved();
    } catch (error) {
      setSaveError(`Not saved: ${(error as Error).message}`);
    } finally {
      setSaving(false);
    }
  }

  // The box the fraction keys write into: the last reading box touched, else the one read most.
  const [fractionTarget, setFractionTarget] = useState<LengthBox | null>(null);
  const typing = fractionTarget ?? (method === "marks" ? "marksAfter" : "strokes.0.value");
  /** A reading box for a length, registered under its name, that the fraction keys write into once touched. */
  const lengthBox = (name: LengthBox, label: string, more: { id?: string; hint?: string; key?: number } = {}) => (
    <NumberBox
      key={more.key}
      id={more.id ?? name}
      label={label}
      unit={entryUnits.length}
      reg={register(name)}
      error={(get(err, name) as HookFieldError | undefined)?.message}
      hint={more.hint}
      onFocus={() => setFractionTarget(name)}
    />
  );
  // Gauge steps are rarely read: folded away until the crew opens them (two rows), and folded again
  // only by taking every row away, so nothing typed travels unseen.
  const showSteps = stepRows.fields.length > 0;
  const lengthLabel = (box: LengthBox) =>
    box === "marksBefore"
      ? "Mark before"
      : box === "marksAfter"
        ? "Mark after"
        : box === "seating"
          ? "Seating"
          : box === "drawIn"
            ? "Draw-in"
            : box === "rereadMarksAfter"
              ? "Mark after, read again"
              : box.startsWith("gaugeSteps")
                ? `Step ${Number(box.split(".")[1]) + 1} reading`
                : box.startsWith("rereadStrokes")
                  ? `Stroke ${Number(box.split(".")[1]) + 1}, read again`
                  : `Stroke ${Number(box.split(".")[1]) + 1}`;
  const pickFraction = (fraction: string) => {
    const now = String(getValues(typing) ?? "");
    setValue(typing, withFraction(now, fraction), {
      shouldDirty: true,
    });
  };
  // Rarely used on an ordinary end: folded away so the readings and Save fit on one screen, opened
  // by itself when it holds something or an error.
  const [moreOpen, setMoreOpen] = useState(false);
  const moreHasSomething =
    photos.length > 0 || Boolean(err.wireBreaks || err.wireBreakDetails || err.remarks) || breakRows.fields.length > 0;
  const showMore = moreOpen || moreHasSomething;

  const endChoice = (
    <fieldset aria-describedby={groupError("tendonEnd", err.tendonEnd?.message)}>
      <legend className="sr-only">Tendon end</legend>
      <div className="flex gap-2">
        {/* Only the ends this tendon stresses are offered; a correction keeps its record's end. */}
        {ends.map((end) => (
          <label key={end} className={`${CHIP} px-3 ${correcting ? "opacity-40" : ""}`}>
            <input
              type="radio"
              value={end}
              className="sr-only"
              disabled={Boolean(correcting)}
              {...register("tendonEnd")}
            />
            End {end}
            {doneEnds.has(end) && !correcting ? " (done)" : ""}
          </label>
        ))}
      </div>
      <GroupError id="tendonEnd" message={err.tendonEnd?.message} />
    </fieldset>
  );

  return (
    <ClientForm
      onSubmit={handleSubmit(submit)}
      className="card grid min-w-0 gap-3 p-3"
      aria-label={correcting ? "Correct the record" : "New record"}
      data-testid="record-form"
      noValidate
    >
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        {/* In landscape the column beside names the tendon; the row keeps its room for the ends and the target. */}
        <h3 className={`text-lead font-bold ${correcting ? "" : "landscape:sr-only"}`}>
          {correcting
            ? `Correct end ${correcting.tendonEnd} (revision ${correcting.revision + 1})`
            : `Record ${ctx.tendon.tag}`}
        </h3>
        {endChoice}
        <div className="ml-auto rounded-md bg-concrete-100 px-3 py-1 text-right" data-testid="target-pressure">
          <span className="field-label">Target gauge pressure</span>
          <p className="text-lead font-bold tabular-nums">
            {!set ? "Pick a set" : targetMPa === null ? "No calibration" : showPressure(units(ctx.project), targetMPa)}
          </p>
        </div>
      </div>
      {/* Blind entry keeps the predicted elongation and its band from the reader, never the pressure to pump to. */}
      {blind && (
        <p className="text-base text-ink-soft" data-testid="blind-note">
          Blind entry: the predicted elongation and its band are shown after saving.
        </p>
      )}

      {concreteGate !== null && (
        <div className="rounded-md border-2 border-signal-stop p-3" data-testid="concrete-go-ahead">
          <p className="font-bold text-signal-stop">
            <span aria-hidden="true">⚠ </span>Concrete not confirmed: {concreteGate}
          </p>
          <FormField
            as="textarea"
            id="concreteGoAhead"
            frameClassName="mt-2"
            label="Who confirmed the concrete on site, or why stressing goes ahead"
            hint="Kept on the record; the concrete flag quotes it to the engineer of record."
            error={err.concreteGoAhead?.message}
            announce
            rows={2}
            {...register("concreteGoAhead")}
            placeholder="e.g. inspector J. Ortiz read the field-cured cylinders at 3,100 psi"
          />
        </div>
      )}

      {correcting && (
        <FormField
          id="revisionReason"
          label="Why is it corrected?"
          error={err.revisionReason?.message}
          announce
          {...register("revisionReason")}
          placeholder="e.g. read the wrong mark"
        />
      )}

      {/* min-w-0: a fieldset is at least as wide as its content by default, which would let the
          sets' row widen the form instead of scrolling inside it. */}
      <fieldset className="min-w-0" aria-describedby={groupError("equipmentSetId", err.equipmentSetId?.message)}>
        <legend className="field-label">
          Equipment set
          {notOffered > 0 && (
            <span className="font-normal normal-case text-ink-soft">
              {" "}
              · {notOffered} without a calibration not offered
            </span>
          )}
        </legend>
        {/* One row whatever the number of jacks: more sets scroll sideways, so Save stays on screen. */}
        <div className="mt-1 flex gap-2 overflow-x-auto pb-1">
          {offered.length === 0 && <p>No equipment set with a calibration was downloaded with this pour.</p>}
          {offered.map((s) => {
            const c = calibrationFor(ctx.calibrations, s!.id, today);
            return (
              <label
                key={s!.id}
                className="flex min-h-touch shrink-0 cursor-pointer items-center gap-2 rounded-md border-2 border-concrete-500 px-3 py-1 has-checked:border-ink has-checked:bg-concrete-100"
              >
                <input type="radio" value={s!.id} className="h-6 w-6 shrink-0" {...register("equipmentSetId")} />
                <span className="leading-tight">
                  <strong>{s!.name}</strong>
                  <br />
                  <span className="text-base">{s!.gaugeSerial} · </span>
                  <span className={`text-base ${c.expired ? "font-bold text-signal-stop" : "text-ink-soft"}`}>
                    {c.calibration
                      ? `${c.expired ? "calibration EXPIRED" : "valid to"} ${c.calibration.validUntil}`
                      : "no calibration"}
                  </span>
                </span>
              </label>
            );
          })}
        </div>
        <GroupError id="equipmentSetId" message={err.equipmentSetId?.message} />
        {expired && setId && (
          <FormField
            id="expiredCalibrationReason"
            frameClassName="mt-2"
            label="Reason to use a set whose calibration has expired"
            error={err.expiredCalibrationReason?.message}
            announce
            {...register("expiredCalibrationReason")}
          />
        )}
      </fieldset>

      <div className="flex flex-wrap items-end gap-x-6 gap-y-3">
        <div className="grid w-[26rem] max-w-full grid-cols-2 gap-3">
          <NumberBox
            id="initialPressure"
            label="Initial gauge pressure"
            unit={entryUnits.pressure}
            reg={register("initialPressure")}
            error={err.initialPressure?.message}
            hint="blank = from 0"
          />
          <NumberBox
            id="finalPressure"
            label="Final gauge pressure"
            unit={entryUnits.pressure}
            reg={register("finalPressure")}
            error={err.finalPressure?.message}
          />
        </div>
        {/* Beside the pressures, where there is room on either orientation: the rows fold out below. */}
        <button
          type="button"
          className="btn-quiet px-3"
          aria-expanded={showSteps}
          aria-controls="gauge-steps"
          onClick={() =>
            showSteps
              ? (setFractionTarget(null), stepRows.remove())
              : stepRows.append([
                  { pressure: "", reading: "" },
                  { pressure: "", reading: "" },
                ])
          }
        >
          {showSteps ? "No gauge steps" : "Gauge steps…"}
        </button>
        <fieldset>
          <legend className="field-label">Elongation read as</legend>
          <div className="mt-1 flex flex-wrap gap-2">
            <label className={`${CHIP} px-3`}>
              <input type="radio" value="marks" className="sr-only" {...register("readingMethod")} />
              Marks
            </label>
            <label className={`${CHIP} px-3`}>
              <input type="radio" value="strokes" className="sr-only" {...register("readingMethod")} />
              Ram strokes
            </label>
          </div>
        </fieldset>
        {ends.length === 2 && (
          <fieldset aria-describedby={groupError("stressingOrder", err.stressingOrder?.message)}>
            <legend className="field-label">The two ends were stressed</legend>
            <div className="mt-1 flex flex-wrap gap-2">
              <label className={`${CHIP} px-3`}>
                <input type="radio" value="sequential" className="sr-only" {...register("stressingOrder")} />
                One after the other
              </label>
              <label className={`${CHIP} px-3`}>
                <input type="radio" value="simultaneous" className="sr-only" {...register("stressingOrder")} />
                Both at once
              </label>
            </div>
            <GroupError id="stressingOrder" message={err.stressingOrder?.message} />
          </fieldset>
        )}
      </div>

      {method === "marks" ? (
        <div className="grid grid-cols-3 gap-3">
          {lengthBox("marksBefore", "Mark before")}
          {lengthBox("marksAfter", "Mark after lock-off")}
          {lengthBox("seating", "Seating, if measured")}
        </div>
      ) : (
        <div className="grid gap-2">
          <div className="grid grid-cols-3 gap-3">
            {strokes.fields.map((f, i) => (
              <div key={f.id} className="grid content-end gap-1">
                {lengthBox(`strokes.${i}.value`, `Stroke ${i + 1}`, { id: `stroke-${i}` })}
                {strokes.fields.length > 1 && (
                  <button
                    type="button"
                    className="btn-quiet"
                    onClick={() => (setFractionTarget(null), strokes.remove(i))}
                  >
                    Remove stroke {i + 1}
                  </button>
                )}
              </div>
            ))}
            {strokes.fields.length > 1 &&
              lengthBox("drawIn", "Draw-in per re-grip", { hint: "empty: the set's, if it has one; 0 for none" })}
            {lengthBox("seating", "Seating, if measured")}
          </div>
          <div className="flex flex-wrap items-center gap-2">
            <button
              type="button"
              className="btn-quiet"
              onClick={() => strokes.append({ value: "" })}
              disabled={strokes.fields.length >= 8}
            >
              Add a stroke
            </button>
            <p className="text-base text-ink-soft">
              Strokes are added up and compared gross, with the strand inside the jack.
            </p>
          </div>
        </div>
      )}

      {showSteps && (
        <fieldset
          id="gauge-steps"
          className="grid gap-2 rounded-md border-2 border-concrete-300 p-2"
          data-testid="gauge-steps"
        >
          <legend className="field-label px-1">Gauge steps on the way up</legend>
          <p className="text-base text-ink-soft">
            The pressure and the reading at each step (e.g. 20, 40, 60, 80, 100 %), from one fixed origin. The
            elongation above counts from the initial pressure; the steps&apos; least-squares line adds what lies below
            it.
          </p>
          {stepRows.fields.map((f, i) => (
            <div key={f.id} className="grid grid-cols-[minmax(0,1fr)_minmax(0,1fr)_auto] items-end gap-3">
              <NumberBox
                id={`step-pressure-${i}`}
                label={`Step ${i + 1} pressure`}
                unit={entryUnits.pressure}
                reg={register(`gaugeSteps.${i}.pressure`)}
                error={err.gaugeSteps?.[i]?.pressure?.message}
              />
              {lengthBox(`gaugeSteps.${i}.reading`, `Step ${i + 1} reading`, { id: `step-reading-${i}` })}
              <button
                type="button"
                className="btn-quiet"
                aria-label={`Remove step ${i + 1}`}
                onClick={() => (setFractionTarget(null), stepRows.remove(i))}
              >
                Remove
              </button>
            </div>
          ))}
          <div>
            <button
              type="button"
              className="btn-quiet"
              onClick={() => stepRows.append({ pressure: "", reading: "" })}
              disabled={stepRows.fields.length >= MAX_GAUGE_STEPS}
            >
              Add a step
            </button>
          </div>
        </fieldset>
      )}

      {rereadAsked && (
        <div className="grid gap-2 rounded-md border-2 border-signal-stop p-3" data-testid="reread-step">
          <p className="font-bold">
            Read again to {finerDivision(units(ctx.project))}: the reading division alone could change the verdict. Both
            readings are kept; the finer one is judged.
          </p>
          <div className="grid grid-cols-3 gap-3">
            {method === "marks"
              ? lengthBox("rereadMarksAfter", "Mark after, read again")
              : rereadStrokes.map((_, i) =>
                  lengthBox(`rereadStrokes.${i}.value`, `Stroke ${i + 1}, read again`, {
                    id: `reread-stroke-${i}`,
                    key: i,
                  }),
                )}
            <FormField
              id="rereadDeclinedReason"
              frameClassName="col-span-2"
              label="Or why it cannot be read again"
              error={err.rereadDeclinedReason?.message}
              announce
              placeholder="e.g. tails already cut"
              {...register("rereadDeclinedReason")}
            />
          </div>
        </div>
      )}

      {inches && <FractionKeys target={lengthLabel(typing)} onPick={pickFraction} fine={typing.startsWith("reread")} />}

      <div id="record-more" className="grid gap-3" hidden={!showMore}>
        <div className="grid grid-cols-[minmax(0,1fr)_minmax(0,2fr)] gap-3">
          <NumberBox
            id="wireBreaks"
            label="Wire breaks"
            unit="count"
            numeric
            reg={register("wireBreaks")}
            error={err.wireBreaks?.message}
          />
          <FormField
            as="textarea"
            id="remarks"
            label="Remarks"
            error={err.remarks?.message}
            announce
            rows={2}
            {...register("remarks")}
          />
        </div>
        {breakRows.fields.map((f, i) => (
          <fieldset
            key={f.id}
            className="grid gap-2 rounded-md border-2 border-concrete-300 p-2"
            data-testid="wire-break"
          >
            <legend className="field-label px-1">Broken wire {i + 1}</legend>
            <div className="flex flex-wrap items-end gap-3">
              <div className="w-40">
                <NumberBox
                  id={`break-strand-${i}`}
                  label={`Strand (1–${ctx.tendon.strandCount})`}
                  unit="no."
                  numeric
                  reg={register(`wireBreakDetails.${i}.strand`)}
                  error={err.wireBreakDetails?.[i]?.strand?.message}
                />
              </div>
              <label className={`${CHIP} px-3`}>
                <input type="checkbox" className="sr-only" {...register(`wireBreakDetails.${i}.strandNotKnown`)} />
                Strand not known
              </label>
            </div>
            <div
              className="flex flex-wrap gap-2"
              role="radiogroup"
              aria-label={`Where wire ${i + 1} broke`}
              aria-describedby={groupError(`break-where-${i}`, err.wireBreakDetails?.[i]?.where?.message)}
            >
              {WIRE_BREAK_PLACES.map((place) => (
                <label key={place} className={`${CHIP} px-3`}>
                  <input type="radio" value={place} className="sr-only" {...register(`wireBreakDetails.${i}.where`)} />
                  {WIRE_BREAK_PLACE_WORDS[place].replace(/^./, (c) => c.toUpperCase())}
                </label>
              ))}
            </div>
            <GroupError id={`break-where-${i}`} message={err.wireBreakDetails?.[i]?.where?.message} />
          </fieldset>
        ))}
        <PhotoPicker photos={photos} onChange={setPhotos} />
        <p className="text-base text-ink-soft" data-testid="record-by">
          Operator {session.name}; the device time and zone ({Intl.DateTimeFormat().resolvedOptions().timeZone}) are
          stamped on saving.
        </p>
      </div>

      {/* Save, and what stops it, stay on screen even when messages make the form taller than the tablet. */}
      <div className="sticky bottom-0 -mx-3 -mb-3 grid gap-2 rounded-b-lg border-t-2 border-concrete-300 bg-white px-3 py-2">
        {saveError && (
          <p role="alert" className="font-bold text-signal-stop">
            {saveError}
          </p>
        )}
        {offTarget && (
          <div>
            <label htmlFor="offTargetReason" className="field-label">
              Why the gauge is off target
            </label>
            <input
              id="offTargetReason"
              className="field-input"
              value={offTarget.reason}
              onChange={(e) => setOffTarget({ ...offTarget, reason: e.target.value })}
            />
          </div>
        )}
        <div className="flex gap-3">
          <div className="grid shrink-0 content-start gap-2">
            <button type="submit" className="btn-primary min-w-40" disabled={saving}>
              {saving ? "Saving…" : correcting ? "Save correction" : "Save record"}
            </button>
            {onCancel && (
              <button type="button" className="btn-quiet" onClick={onCancel}>
                Cancel
              </button>
            )}
            {!moreHasSomething && (
              <button
                type="button"
                className="btn-quiet px-3 text-base"
                aria-expanded={showMore}
                aria-controls="record-more"
                onClick={() => setMoreOpen(!showMore)}
              >
                {showMore ? "Fold away details" : "Breaks, remarks, photos"}
              </button>
            )}
          </div>
          <SafetyCaution className="flex-1 self-start" />
        </div>
      </div>
    </ClientForm>
  );
}
