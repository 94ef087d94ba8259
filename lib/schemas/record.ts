import type { Selectable } from "kysely";
import { z } from "zod";
import type { RecordsTable } from "@/db/types";
import { text } from "./text";
import { isInputError, parseLength, parsePressure, type LengthUnit, type PressureUnit } from "@/lib/units";
import { WIRE_BREAK_PLACES, type WireBreakPlace } from "./wire-break-words";
import {
  READING_METHODS,
  STRESSING_ORDERS,
  TENDON_ENDS,
  type ReadingMethod,
  type StressingOrder,
  type TendonEnd,
} from "./domain";
import { gaugeOffTargetSchema, type GaugeOffTarget, type GaugeStepSI } from "./stored-entered";

export { WIRE_BREAK_PLACES, WIRE_BREAK_PLACE_WORDS, wireBreakWords, type WireBreakPlace } from "./wire-break-words";
// What stored records' `entered` is read back with (zod/mini, for the tablet's tendon list), here too for the server's readers.
export { storedGaugeOffTarget, storedGaugeSteps, type GaugeOffTarget, type GaugeStepSI } from "./stored-entered";

/**
 * One stressing record of one tendon end, as the crew types it on the tablet and as it travels
 * in a sync operation. The form keeps the text exactly as typed; the payload carries the same
 * text (`entered`) beside the SI values, and the server re-reads the text to check the SI values
 * were derived from it. Shared by the record form (zodResolver), the outbox and the push route.
 */

export const MAX_STROKES = 8;
/** Gauge steps on the way up (e.g. 20/40/60/80/100 %): a handful, at least two pressures. */
export const MAX_GAUGE_STEPS = 10;
/** One broken wire: the strand it is on (its number in the tendon, null when not known) and where. */
export const wireBreakSchema = z
  .object({
    strand: z
      .number({ error: "The strand must be a number, or null when not known." })
      .int("The strand is a whole number.")
      .min(1, "Strands are numbered from 1.")
      .max(99, "The strand number is over 99.")
      .nullable(),
    where: z.enum(WIRE_BREAK_PLACES, { error: "Say where the wire broke." }),
  })
  .strict();
export type WireBreak = z.infer<typeof wireBreakSchema>;

/** The units bare numbers are read in, from the project's unit system. */
export interface EntryUnits {
  length: Extract<LengthUnit, "in" | "mm">;
  pressure: Extract<PressureUnit, "psi" | "MPa">;
}

export function entryUnitsFor(unitSystem: "us" | "si"): EntryUnits {
  return unitSystem === "us" ? { length: "in", pressure: "psi" } : { length: "mm", pressure: "MPa" };
}

const typed = (label: string) =>
  text({ error: `Type the ${label}.` })
    .trim()
    .max(40, `Keep the ${label} under 40 characters.`);

/**
 * One gauge step as typed (pressure and the reading there, from any fixed origin), with the SI
 * values the tablet read from it; the server re-reads the text and checks they agree.
 */
export const gaugeStepEnteredSchema = z
  .object({
    pressure: typed("gauge step pressure").min(1, "Type the gauge step's pressure."),
    reading: typed("gauge step reading").min(1, "Type the reading at the gauge step."),
    pressureMPa: z.number({ error: "The gauge step's pressure in MPa must be a number." }).finite().optional(),
    readingMm: z.number({ error: "The gauge step's reading in mm must be a number." }).finite().optional(),
  })
  .strict();

/** The values exactly as typed, with the units bare numbers were read in. */
export const enteredSchema = z.object({
  units: z.object({ length: z.enum(["in", "mm"]), pressure: z.enum(["psi", "MPa"]) }),
  initialPressure: typed("initial pressure").nullable(),
  finalPressure: typed("final pressure").min(1, "Type the final gauge pressure."),
  marks: z.object({ before: typed("mark before"), after: typed("mark after") }).nullable(),
  strokes: z.array(typed("stroke")).max(MAX_STROKES, `At most ${MAX_STROKES} strokes.`).nullable(),
  seating: typed("seating").nullable(),
  /** Draw-in lost at each re-grip between strokes; absent on records made before it was asked. */
  drawIn: typed("draw-in").nullable().optional(),
  /**
   * The second, finer reading the tablet asks for when the reading division alone could change the
   * verdict: marks, the mark after lock-off read again (the mark before was set, not read); ram
   * strokes, each stroke read again. The first reading stays in `marks` / `strokes`.
   */
  reread: z
    .object({
      marksAfter: typed("mark after, read again").nullable(),
      strokes: z.array(typed("stroke, read again")).max(MAX_STROKES, `At most ${MAX_STROKES} strokes.`).nullable(),
    })
    .nullable()
    .optional(),
  /** Pressures read on the way up with the reading at each; absent on records made before they were asked. */
  gaugeSteps: z
    .array(gaugeStepEnteredSchema)
    .max(MAX_GAUGE_STEPS, `At most ${MAX_GAUGE_STEPS} gauge steps.`)
    .nullable()
    .optional(),
  /** The crew's confirmation of a final pressure off its target by more than the band. */
  gaugeOffTarget: z.nullable(gaugeOffTargetSchema).optional(),
});
export type Entered = z.infer<typeof enteredSchema>;

export interface DerivedValues {
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  measuredMm: number;
  seatingMm: number | null;
  drawInMm: number | null;
  /** The first, coarser reading when the elongation was read again (measuredMm is then the re-read). */
  firstReadingMm: number | null;
  /** The gauge steps in SI, in the order typed; null when none were typed. */
  gaugeSteps: GaugeStepSI[] | null;
}

/** A typed value that could not be read, named by its form field. */
export interface EntryProblem {
  field: string;
  message: string;
}

function read<T>(problems: EntryProblem[], field: string, fn: () => T): T | null {
  try {
    return fn();
  } catch (error) {
    if (!isInputError(error)) throw error;
    const said = error.message.replace(/^[^:]+:\s*/, "");
    problems.push({
      field,
      message: error.code === "required" ? "Type a value here." : said.charAt(0).toUpperCase() + said.slice(1),
    });
    return null;
  }
}

/**
 * Reads the typed text into SI values with lib/units: pressures in MPa, the elongation as the
 * mark distance after minus before, or the strokes summed. Returns the problems per form field.
 */
export function deriveFromEntered(
  entered: Entered,
  method: (typeof READING_METHODS)[number],
): { values: DerivedValues | null; problems: EntryProblem[] } {
  const problems: EntryProblem[] = [];
  const lengthOpts = (field: string) => ({ field, system: "SI" as const, defaultUnit: entered.units.length });
  const pressureOpts = (field: string) => ({ field, system: "SI" as const, defaultUnit: entered.units.pressure });

  const initial = entered.initialPressure
    ? read(problems, "initialPressure", () => parsePressure(entered.initialPressure!, pressureOpts("initialPressure")))
    : null;
  const final = read(problems, "finalPressure", () =>
    parsePressure(entered.finalPressure, pressureOpts("finalPressure")),
  );
  if (final !== null && final <= 0)
    problems.push({ field: "finalPressure", message: "The final gauge pressure must be above zero." });
  if (initial !== null && final !== null && initial >= final) {
    problems.push({ field: "initialPressure", message: "The initial pressure must be below the final pressure." });
  }

  let measured: number | null = null;
  if (method === "marks") {
    if (!entered.marks) {
      problems.push({ field: "marksAfter", message: "Type the mark distances before and after." });
    } else {
      const before = read(problems, "marksBefore", () => parseLength(entered.marks!.before, lengthOpts("marksBefore")));
      const after = read(problems, "marksAfter", () => parseLength(entered.marks!.after, lengthOpts("marksAfter")));
      if (before !== null && after !== null) {
        measured = after - before;
        if (measured <= 0)
          problems.push({ field: "marksAfter", message: "The mark after must be farther out than the mark before." });
      }
    }
  } else {
    const strokes = (entered.strokes ?? []).filter((s) => s.trim() !== "");
    if (!strokes.length) problems.push({ field: "strokes.0", message: "Type at least one ram stroke." });
    let sum = 0;
    let ok = strokes.length > 0;
    strokes.forEach((s, i) => {
      const v = read(problems, `strokes.${i}`, () => parseLength(s, lengthOpts(`strokes.${i}`)));
      if (v === null) ok = false;
      else if (v <= 0) {
        problems.push({ field: `strokes.${i}`, message: "A stroke must be longer than zero." });
        ok = false;
      } else sum += v;
    });
    if (ok) measured = sum;
  }
  // Read again, finer: the re-read is the elongation judged, the first reading is kept beside it.
  let firstReadingMm: number | null = null;
  const again = entered.reread ?? null;
  if (again && measured !== null) {
    let fine: number | null = null;
    if (method === "marks") {
      if (!again.marksAfter) problems.push({ field: "rereadMarksAfter", message: "Type the mark after, read again." });
      else {
        const before = parseLength(entered.marks!.before, lengthOpts("marksBefore"));
        const after = read(problems, "rereadMarksAfter", () =>
          parseLength(again.marksAfter!, lengthOpts("rereadMarksAfter")),
        );
        if (after !== null) {
          fine = after - before;
          if (fine <= 0)
            problems.push({
              field: "rereadMarksAfter",
              message: "The mark after, read again, must be farther out than the mark before.",
            });
        }
      }
    } else {
      const first = (entered.strokes ?? []).filter((s) => s.trim() !== "");
      const strokesAgain = again.strokes ?? [];
      let sum = 0;
      let ok = true;
      first.forEach((_, i) => {
        const typedAgain = strokesAgain[i]?.trim() ?? "";
        if (!typedAgain) {
          problems.push({ field: `rereadStrokes.${i}`, message: `Type stroke ${i + 1}, read again.` });
          ok = false;
          return;
        }
        const v = read(problems, `rereadStrokes.${i}`, () => parseLength(typedAgain, lengthOpts(`rereadStrokes.${i}`)));
        if (v === null) ok = false;
        else if (v <= 0) {
          problems.push({ field: `rereadStrokes.${i}`, message: "A stroke must be longer than zero." });
          ok = false;
        } else sum += v;
      });
      if (strokesAgain.length > first.length)
        problems.push({
          field: `rereadStrokes.${first.length}`,
          message: "More strokes read again than first read: clear the extra one.",
        });
      else if (ok) fine = sum;
    }
    if (fine !== null && fine > 0) {
      firstReadingMm = measured;
      measured = fine;
    }
  }

  const seating = entered.seating
    ? read(problems, "seating", () => parseLength(entered.seating!, lengthOpts("seating")))
    : null;

  const drawIn =
    method === "strokes" && entered.drawIn
      ? read(problems, "drawIn", () => parseLength(entered.drawIn!, lengthOpts("drawIn")))
      : null;
  if (method === "marks" && entered.drawIn)
    problems.push({ field: "drawIn", message: "Draw-in per re-grip applies to ram strokes only; clear it." });

  const gaugeSteps = readGaugeSteps(entered, initial, problems);

  if (problems.length || final === null || measured === null) return { values: null, problems };
  return {
    values: {
      initialPressureMPa: initial,
      finalPressureMPa: final,
      measuredMm: measured,
      seatingMm: seating,
      drawInMm: drawIn,
      firstReadingMm,
      gaugeSteps,
    },
    problems,
  };
}

/**
 * The gauge steps read into SI. At least two different pressures, the readings rising with the
 * pressure (the strand lengthens as the force rises), and the initial pressure the elongation was
 * read from typed: the steps' line brings the reading from there to zero force.
 */
function readGaugeSteps(entered: Entered, initial: number | null, problems: EntryProblem[]): GaugeStepSI[] | null {
  const typedSteps = entered.gaugeSteps ?? [];
  if (!typedSteps.length) return null;
  const steps: GaugeStepSI[] = [];
  typedSteps.forEach((step, i) => {
    const pressure = read(problems, `gaugeSteps.${i}.pressure`, () =>
      parsePressure(step.pressure, {
        field: `gaugeSteps.${i}.pressure`,
        system: "SI",
        defaultUnit: entered.units.pressure,
      }),
    );
    const reading = read(problems, `gaugeSteps.${i}.reading`, () =>
      parseLength(step.reading, { field: `gaugeSteps.${i}.reading`, system: "SI", defaultUnit: entered.units.length }),
    );
    if (pressure !== null && pressure <= 0)
      problems.push({ field: `gaugeSteps.${i}.pressure`, message: "The gauge step's pressure must be above zero." });
    if (pressure !== null && reading !== null) steps.push({ pressureMPa: pressure, readingMm: reading });
  });
  if (steps.length !== typedSteps.length) return null;
  const pressures = new Set(steps.map((s) => s.pressureMPa));
  if (pressures.size < 2) {
    problems.push({
      field: `gaugeSteps.${Math.min(1, steps.length - 1)}.pressure`,
      message: "Gauge steps need at least two different pressures.",
    });
    return null;
  }
  const byPressure = [...steps].sort((a, b) => a.pressureMPa - b.pressureMPa);
  const falls = byPressure.findIndex((s, k) => k > 0 && s.readingMm <= byPressure[k - 1]!.readingMm);
  if (falls > 0) {
    const i = steps.indexOf(byPressure[falls]!);
    problems.push({
      field: `gaugeSteps.${i}.reading`,
      message: "The reading must grow with the pressure: it is not above the step below it.",
    });
  }
  if (initial === null)
    problems.push({
      field: "initialPressure",
      message: "With gauge steps, type the initial pressure the elongation was read from (usually the first step's).",
    });
  return steps;
}

// ---------------------------------------------------------------------------------------------
// The form, as the crew fills it in.

export interface RecordFormContext {
  units: EntryUnits;
  /** Equipment sets whose calibration is expired (or missing) on the day of the record. */
  expiredSetIds: readonly string[];
  /** Ends the tendon's schedule stresses. */
  ends: readonly ("A" | "B")[];
  /** A correction of a record already saved: a reason is required. */
  correction: boolean;
  /** The tablet asked for a finer second reading: the re-read, or a reason it cannot be taken, is required. */
  rereadAsked?: boolean;
  /** Strands in the tendon: a broken wire's strand number is at most this. */
  strandCount?: number;
  /** The pour's concrete strength is not confirmed (the concrete gate): a reason to go ahead is required. */
  concreteUnconfirmed?: boolean;
}

export const recordFormShape = z.object({
  tendonEnd: z.enum(TENDON_ENDS, { error: "Pick the end you stressed." }),
  equipmentSetId: text({ error: "Pick the equipment set." }).min(1, "Pick the equipment set."),
  expiredCalibrationReason: text().trim().max(500, "Keep the reason under 500 characters."),
  readingMethod: z.enum(READING_METHODS, { error: "Pick how the elongation was read." }),
  initialPressure: text().trim().max(40),
  finalPressure: text().trim().max(40),
  marksBefore: text().trim().max(40),
  marksAfter: text().trim().max(40),
  strokes: z.array(z.object({ value: text().trim().max(40) })).max(MAX_STROKES),
  seating: text().trim().max(40),
  drawIn: text().trim().max(40),
  /** The finer second reading (see `Entered.reread`) and the crew's reason when it cannot be taken. */
  rereadMarksAfter: text().trim().max(40),
  rereadStrokes: z.array(z.object({ value: text().trim().max(40) })).max(MAX_STROKES),
  rereadDeclinedReason: text().trim().max(500, "Keep the reason under 500 characters."),
  /** Gauge steps as typed, one row each; rows left blank are dropped. */
  gaugeSteps: z
    .array(z.object({ pressure: text().trim().max(40), reading: text().trim().max(40) }))
    .max(MAX_GAUGE_STEPS),
  /** Two-end tendons: one end after the other, or both at once. */
  stressingOrder: z.enum(STRESSING_ORDERS, { error: "Say how the two ends were stressed." }),
  wireBreaks: text()
    .trim()
    .regex(/^\d{0,2}$/, "Type the number of broken wires as a whole number (0 if none)."),
  /** One row per broken wire: the strand's number as typed (or not known) and where it broke. */
  wireBreakDetails: z
    .array(
      z.object({
        strand: text().trim().max(4),
        strandNotKnown: z.boolean(),
        where: z.enum([...WIRE_BREAK_PLACES, ""]),
      }),
    )
    .max(99),
  remarks: text().trim().max(2000, "Keep the remarks under 2000 characters."),
  revisionReason: text().trim().max(500, "Keep the reason under 500 characters."),
  concreteGoAhead: text().trim().max(500, "Keep the reason under 500 characters."),
});
export type RecordFormValues = z.infer<typeof recordFormShape>;

export const EMPTY_RECORD_FORM: RecordFormValues = {
  tendonEnd: "A",
  equipmentSetId: "",
  expiredCalibrationReason: "",
  readingMethod: "marks",
  initialPressure: "",
  finalPressure: "",
  marksBefore: "",
  marksAfter: "",
  strokes: [{ value: "" }],
  seating: "",
  drawIn: "",
  rereadMarksAfter: "",
  rereadStrokes: [],
  rereadDeclinedReason: "",
  gaugeSteps: [],
  stressingOrder: "sequential",
  wireBreaks: "0",
  wireBreakDetails: [],
  remarks: "",
  revisionReason: "",
  concreteGoAhead: "",
};

export function enteredFromForm(values: RecordFormValues, units: EntryUnits): Entered {
  return {
    units,
    initialPressure: values.initialPressure || null,
    finalPressure: values.finalPressure,
    marks: values.readingMethod === "marks" ? { before: values.marksBefore, after: values.marksAfter } : null,
    strokes: values.readingMethod === "strokes" ? values.strokes.map((s) => s.value).filter((s) => s !== "") : null,
    seating: values.seating || null,
    drawIn: values.readingMethod === "strokes" ? values.drawIn || null : null,
    reread: rereadFromForm(values),
    gaugeSteps: stepsFromForm(values),
  };
}

/** The gauge step rows with anything typed, as typed; null when none. */
function stepsFromForm(values: RecordFormValues): Entered["gaugeSteps"] {
  const rows = values.gaugeSteps.filter((s) => s.pressure !== "" || s.reading !== "");
  return rows.length ? rows.map((s) => ({ pressure: s.pressure, reading: s.reading })) : null;
}

/** The finer second reading as typed, or null when none was typed. */
function rereadFromForm(values: RecordFormValues): Entered["reread"] {
  if (values.readingMethod === "marks")
    return values.rereadMarksAfter ? { marksAfter: values.rereadMarksAfter, strokes: null } : null;
  const strokes = values.rereadStrokes.map((s) => s.value);
  return strokes.some((s) => s !== "") ? { marksAfter: null, strokes } : null;
}

/** "strokes.2" names the third stroke box, whose value sits at strokes[2].value in the form. */
function formPath(field: string): (string | number)[] {
  const step = /^gaugeSteps\.(\d+)\.(pressure|reading)$/.exec(field);
  if (step) return ["gaugeSteps", Number(step[1]), step[2]!];
  const stroke = /^(strokes|rereadStrokes)\.(\d+)$/.exec(field);
  return stroke ? [stroke[1]!, Number(stroke[2]), "value"] : [field];
}

/** The form's schema for one tendon and project: every message names the box it belongs to. */
export function recordFormSchema(context: RecordFormContext) {
  return recordFormShape.superRefine((values, ctx) => {
    if (!context.ends.includes(values.tendonEnd)) {
      ctx.addIssue({
        code: "custom",
        path: ["tendonEnd"],
        message: `This tendon is stressed at end ${context.ends.join(" and ")} only.`,
      });
    }
    if (context.expiredSetIds.includes(values.equipmentSetId) && values.expiredCalibrationReason.length < 3) {
      ctx.addIssue({
        code: "custom",
        path: ["expiredCalibrationReason"],
        message: "This set's calibration has expired: say why it is used anyway.",
      });
    }
    if (!values.finalPressure)
      ctx.addIssue({ code: "custom", path: ["finalPressure"], message: "Type the final gauge pressure." });
    if (context.concreteUnconfirmed && values.concreteGoAhead.length < 3) {
      ctx.addIssue({
        code: "custom",
        path: ["concreteGoAhead"],
        message: "The concrete strength is not confirmed: say who confirmed it on site, or why stressing goes ahead.",
      });
    }
    if (context.correction && values.revisionReason.length < 3) {
      ctx.addIssue({ code: "custom", path: ["revisionReason"], message: "Say why this record is corrected." });
    }
    const rereadTyped = rereadFromForm(values) !== null;
    if (rereadTyped && values.rereadDeclinedReason) {
      ctx.addIssue({
        code: "custom",
        path: ["rereadDeclinedReason"],
        message: "A finer reading was typed: clear this reason, or clear the finer reading.",
      });
    }
    if (context.rereadAsked && !rereadTyped && values.rereadDeclinedReason.length < 3) {
      ctx.addIssue({
        code: "custom",
        path: ["rereadDeclinedReason"],
        message: "Read the elongation again to the finer division, or say why it cannot be read again.",
      });
    }
    const breaks = Number(values.wireBreaks || "0");
    values.wireBreakDetails.slice(0, breaks).forEach((b, i) => {
      if (!b.strandNotKnown) {
        const n = Number(b.strand);
        if (!/^\d{1,2}$/.test(b.strand) || n < 1)
          ctx.addIssue({
            code: "custom",
            path: ["wireBreakDetails", i, "strand"],
            message: `Break ${i + 1}: type the strand's number, or press "Not known".`,
          });
        else if (context.strandCount !== undefined && n > context.strandCount)
          ctx.addIssue({
            code: "custom",
            path: ["wireBreakDetails", i, "strand"],
            message: `Break ${i + 1}: this tendon has ${context.strandCount} strand${context.strandCount > 1 ? "s" : ""}.`,
          });
      }
      if (!b.where)
        ctx.addIssue({
          code: "custom",
          path: ["wireBreakDetails", i, "where"],
          message: `Break ${i + 1}: say where the wire broke.`,
        });
    });
    if (breaks > 0 && values.wireBreakDetails.length < breaks)
      ctx.addIssue({
        code: "custom",
        path: ["wireBreaks"],
        message: "Say which strand and where for each broken wire.",
      });
    if (values.finalPressure) {
      const { problems } = deriveFromEntered(enteredFromForm(values, context.units), values.readingMethod);
      // Blank step rows are dropped from what is read: a step's problem goes to its own row.
      const stepRows = values.gaugeSteps.flatMap((s, i) => (s.pressure !== "" || s.reading !== "" ? [i] : []));
      for (const p of problems) {
        const path = formPath(p.field);
        if (path[0] === "gaugeSteps") path[1] = stepRows[path[1] as number] ?? path[1]!;
        ctx.addIssue({ code: "custom", path, message: p.message });
      }
    }
  });
}

// ---------------------------------------------------------------------------------------------
// The payload of a sync operation: what the server stores.

const uuid = (what: string) => z.uuid({ error: `Not a ${what} id.` });
const optionalText = (max: number, label: string) =>
  text().trim().min(1, `The ${label} is empty.`).max(max, `Keep the ${label} under ${max} characters.`).nullable();

// Two readings derived the same way agree to the last bits of a double.
const agrees = (a: number | null, b: number | null) =>
  a === null || b === null ? a === b : Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));

export const recordPayloadSchema = z
  .object({
    projectId: uuid("project"),
    pourId: uuid("pour"),
    tendonId: uuid("tendon"),
    tendonEnd: z.enum(TENDON_ENDS, { error: "The tendon end must be A or B." }),
    chainId: uuid("record chain"),
    revision: z.number({ error: "The revision must be a number." }).int().min(1).max(1000),
    baseRecordId: uuid("base record").nullable(),
    revisionReason: optionalText(500, "reason for the correction"),
    equipmentSetId: uuid("equipment set"),
    calibrationId: uuid("calibration").nullable(),
    expiredCalibrationReason: optionalText(500, "reason for using an expired set"),
    /** Absent from tablets that predate the concrete gate's question. */
    concreteGoAhead: text()
      .trim()
      .min(3, "Say in a few words why stressing goes ahead before the concrete is confirmed.")
      .max(500, "Keep the reason to stress before the concrete is confirmed under 500 characters.")
      .nullable()
      .optional(),
    initialPressureMPa: z.number().finite().nonnegative("The initial pressure cannot be negative.").nullable(),
    finalPressureMPa: z.number().finite().positive("The final pressure must be above zero."),
    readingMethod: z.enum(READING_METHODS, { error: "The reading method must be marks or strokes." }),
    entered: enteredSchema,
    measuredMm: z
      .number()
      .finite()
      .positive("The measured elongation must be above zero.")
      .max(5000, "The measured elongation is over 5 m."),
    seatingMm: z
      .number()
      .finite()
      .nonnegative("Seating cannot be negative.")
      .max(100, "Seating over 100 mm is not a reading.")
      .nullable(),
    drawInMm: z
      .number()
      .finite()
      .nonnegative("Draw-in cannot be negative.")
      .max(49, "Draw-in over 49 mm per re-grip is not a reading.")
      .nullable()
      .optional(),
    stressingOrder: z
      .enum(STRESSING_ORDERS, { error: "The stressing order must be sequential or simultaneous." })
      .nullable()
      .optional(),
    /** The first reading when the elongation was read again finer (measuredMm is the re-read). */
    firstReadingMm: z
      .number()
      .finite()
      .positive("The first reading must be above zero.")
      .max(5000, "The first reading is over 5 m.")
      .nullable()
      .optional(),
    /** Why the finer second reading the tablet asked for could not be taken. */
    rereadDeclinedReason: text()
      .trim()
      .min(3, "Say in a few words why the elongation could not be read again.")
      .max(500, "Keep the reason the elongation was not read again under 500 characters.")
      .nullable()
      .optional(),
    wireBreaks: z.number().int("Wire breaks are a whole number.").min(0).max(99),
    /** Which strand and where, one per broken wire; absent from tablets that predate the question. */
    wireBreakDetails: z.array(wireBreakSchema).max(99).optional(),
    remarks: optionalText(2000, "remarks"),
    deviceTime: z.iso.datetime({ offset: true, error: "The device time must be an ISO date and time." }),
    deviceTimeZone: text()
      .min(1)
      .max(64)
      .regex(/^[A-Za-z0-9_+\-/]+$/, "Not a time zone name."),
    authorUserId: uuid("operator"),
  })
  .strict()
  .superRefine((p, ctx) => {
    if (p.wireBreakDetails && p.wireBreakDetails.length !== p.wireBreaks)
      ctx.addIssue({
        code: "custom",
        path: ["wireBreakDetails"],
        message: `Name the strand and place of each of the ${p.wireBreaks} broken wires (${p.wireBreakDetails.length} given).`,
      });
    if (p.revision === 1 && (p.baseRecordId !== null || p.revisionReason !== null)) {
      ctx.addIssue({
        code: "custom",
        path: ["baseRecordId"],
        message: "A first record names no base and no correction reason.",
      });
    }
    if (p.revision > 1 && (p.baseRecordId === null || p.revisionReason === null || p.revisionReason.length < 3)) {
      ctx.addIssue({
        code: "custom",
        path: ["revisionReason"],
        message: "A correction names the record it corrects and a reason.",
      });
    }
    const derived = deriveFromEntered(p.entered, p.readingMethod);
    for (const problem of derived.problems)
      ctx.addIssue({ code: "custom", path: ["entered", problem.field], message: problem.message });
    const v = derived.values;
    if (!v) return;
    if (!agrees(v.finalPressureMPa, p.finalPressureMPa))
      ctx.addIssue({
        code: "custom",
        path: ["finalPressureMPa"],
        message: "The final pressure does not match the value as typed.",
      });
    if (!agrees(v.initialPressureMPa, p.initialPressureMPa))
      ctx.addIssue({
        code: "custom",
        path: ["initialPressureMPa"],
        message: "The initial pressure does not match the value as typed.",
      });
    if (!agrees(v.measuredMm, p.measuredMm))
      ctx.addIssue({
        code: "custom",
        path: ["measuredMm"],
        message: "The elongation does not match the readings as typed.",
      });
    if (!agrees(v.seatingMm, p.seatingMm))
      ctx.addIssue({ code: "custom", path: ["seatingMm"], message: "The seating does not match the value as typed." });
    if (!agrees(v.drawInMm, p.drawInMm ?? null))
      ctx.addIssue({ code: "custom", path: ["drawInMm"], message: "The draw-in does not match the value as typed." });
    if (!agrees(v.firstReadingMm, p.firstReadingMm ?? null))
      ctx.addIssue({
        code: "custom",
        path: ["firstReadingMm"],
        message: "The first reading does not match the readings as typed.",
      });
    (p.entered.gaugeSteps ?? []).forEach((step, i) => {
      const read = v.gaugeSteps?.[i];
      if (!read) return;
      if (step.pressureMPa === undefined || !agrees(read.pressureMPa, step.pressureMPa))
        ctx.addIssue({
          code: "custom",
          path: ["entered", "gaugeSteps", i, "pressureMPa"],
          message: `Gauge step ${i + 1}: the pressure does not match the value as typed.`,
        });
      if (step.readingMm === undefined || !agrees(read.readingMm, step.readingMm))
        ctx.addIssue({
          code: "custom",
          path: ["entered", "gaugeSteps", i, "readingMm"],
          message: `Gauge step ${i + 1}: the reading does not match the value as typed.`,
        });
    });
    if (v.firstReadingMm !== null && p.rereadDeclinedReason)
      ctx.addIssue({
        code: "custom",
        path: ["rereadDeclinedReason"],
        message: "The elongation was read again: a reason for not reading it again does not belong here.",
      });
  });
export type RecordPayload = z.infer<typeof recordPayloadSchema>;

/** Builds the payload from a filled-in form; throws when the form does not read (validate first). */
export function payloadFromForm(
  values: RecordFormValues,
  context: {
    units: EntryUnits;
    projectId: string;
    pourId: string;
    tendonId: string;
    chainId: string;
    revision: number;
    baseRecordId: string | null;
    calibrationId: string | null;
    expired: boolean;
    /** The tendon is stressed at both ends: the order is recorded. */
    twoEnds?: boolean;
    /** The concrete gate is not met: the crew's reason to go ahead travels with the record. */
    concreteUnconfirmed?: boolean;
    /** The crew confirmed a final pressure off its target by more than the band. */
    gaugeOffTarget?: GaugeOffTarget | null;
    authorUserId: string;
    now: Date;
    timeZone: string;
  },
): RecordPayload {
  const entered = enteredFromForm(values, context.units);
  const { values: v, problems } = deriveFromEntered(entered, values.readingMethod);
  if (!v) throw new Error(`the record form does not read: ${problems.map((p) => p.field).join(", ")}`);
  if (entered.gaugeSteps && v.gaugeSteps)
    entered.gaugeSteps = entered.gaugeSteps.map((s, i) => ({ ...s, ...v.gaugeSteps![i]! }));
  if (context.gaugeOffTarget) entered.gaugeOffTarget = context.gaugeOffTarget;
  return {
    projectId: context.projectId,
    pourId: context.pourId,
    tendonId: context.tendonId,
    tendonEnd: values.tendonEnd,
    chainId: context.chainId,
    revision: context.revision,
    baseRecordId: context.baseRecordId,
    revisionReason: context.revision > 1 ? values.revisionReason : null,
    equipmentSetId: values.equipmentSetId,
    calibrationId: context.calibrationId,
    expiredCalibrationReason: context.expired ? values.expiredCalibrationReason : null,
    initialPressureMPa: v.initialPressureMPa,
    finalPressureMPa: v.finalPressureMPa,
    readingMethod: values.readingMethod,
    entered,
    measuredMm: v.measuredMm,
    seatingMm: v.seatingMm,
    drawInMm: v.drawInMm,
    stressingOrder: context.twoEnds ? values.stressingOrder : null,
    firstReadingMm: v.firstReadingMm,
    rereadDeclinedReason: v.firstReadingMm === null && values.rereadDeclinedReason ? values.rereadDeclinedReason : null,
    wireBreaks: Number(values.wireBreaks || "0"),
    wireBreakDetails: values.wireBreakDetails.slice(0, Number(values.wireBreaks || "0")).map((b) => ({
      strand: b.strandNotKnown ? null : Number(b.strand),
      where: b.where as WireBreakPlace,
    })),
    remarks: values.remarks || null,
    deviceTime: context.now.toISOString(),
    deviceTimeZone: context.timeZone,
    authorUserId: context.authorUserId,
    ...(context.concreteUnconfirmed ? { concreteGoAhead: values.concreteGoAhead } : {}),
  };
}

const storedBreaks = z.array(wireBreakSchema);

/** The wire breaks' strand and place as a row stores them (jsonb); null when absent or not readable. */
export function storedWireBreaks(value: unknown): WireBreak[] | null {
  const parsed = storedBreaks.safeParse(value);
  return parsed.success ? parsed.data : null;
}

// ---------------------------------------------------------------------------------------------
// The record as stored, for every reader.

/**
 * One stored revision of a stressing record as every reader gets it (the tablet's pull, the
 * tendon's review page and screen, the stressing report): the one DTO, made from a row by
 * `recordFromRow` only. SI, with the text as typed in `entered`; instants as ISO text.
 */
export interface StressingRecord {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  tendonEnd: TendonEnd;
  /** The record's revisions share a chain; revision 1 is the tablet's own. */
  chainId: string;
  revision: number;
  baseRecordId: string | null;
  revisionReason: string | null;
  equipmentSetId: string;
  calibrationId: string | null;
  expiredCalibrationReason: string | null;
  /** The crew's reason to stress while the pour's concrete strength was not confirmed. */
  concreteGoAhead: string | null;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  readingMethod: ReadingMethod;
  /** The values exactly as typed (`Entered`, as stored: read it with `storedGaugeSteps` and the like). */
  entered: Record<string, unknown>;
  measuredMm: number;
  seatingMm: number | null;
  drawInMm: number | null;
  stressingOrder: StressingOrder | null;
  /** The first, coarser reading when the elongation was read again finer (measuredMm is the re-read). */
  firstReadingMm: number | null;
  rereadDeclinedReason: string | null;
  wireBreaks: number;
  /** One entry per broken wire; null on records made before they were asked. */
  wireBreakDetails: WireBreak[] | null;
  remarks: string | null;
  /** The tablet's time of the stressing, and its time zone. */
  deviceTime: string;
  deviceTimeZone: string;
  /** When the server stored it. */
  receivedAt: string;
  authorUserId: string;
  /** Who recorded it (the person signed in on the tablet). */
  authorName: string;
  /** The disposition a re-stressing answers. */
  restressOfDispositionId: string | null;
}

/** The columns of `records` that `recordFromRow` reads, beside `users.name as author_name`. */
export const RECORD_COLUMNS = [
  "id",
  "project_id",
  "pour_id",
  "tendon_id",
  "tendon_end",
  "chain_id",
  "revision",
  "base_record_id",
  "revision_reason",
  "equipment_set_id",
  "calibration_id",
  "expired_calibration_reason",
  "concrete_go_ahead",
  "initial_pressure_mpa",
  "final_pressure_mpa",
  "reading_method",
  "entered",
  "measured_mm",
  "seating_mm",
  "draw_in_mm",
  "stressing_order",
  "first_reading_mm",
  "reread_declined_reason",
  "wire_breaks",
  "wire_break_details",
  "remarks",
  "device_time",
  "device_time_zone",
  "received_at",
  "author_user_id",
  "restress_of_disposition_id",
] as const satisfies readonly (keyof RecordsTable)[];

export type RecordRow = Omit<
  Pick<Selectable<RecordsTable>, (typeof RECORD_COLUMNS)[number]>,
  "device_time" | "received_at"
> & { device_time: Date | string; received_at: Date | string; author_name: string };

export function recordFromRow(row: RecordRow): StressingRecord {
  return {
    id: row.id,
    projectId: row.project_id,
    pourId: row.pour_id,
    tendonId: row.tendon_id,
    tendonEnd: row.tendon_end,
    chainId: row.chain_id,
    revision: row.revision,
    baseRecordId: row.base_record_id,
    revisionReason: row.revision_reason,
    equipmentSetId: row.equipment_set_id,
    calibrationId: row.calibration_id,
    expiredCalibrationReason: row.expired_calibration_reason,
    concreteGoAhead: row.concrete_go_ahead,
    initialPressureMPa: row.initial_pressure_mpa,
    finalPressureMPa: row.final_pressure_mpa,
    readingMethod: row.reading_method,
    entered: row.entered,
    measuredMm: row.measured_mm,
    seatingMm: row.seating_mm,
    drawInMm: row.draw_in_mm,
    stressingOrder: row.stressing_order,
    firstReadingMm: row.first_reading_mm,
    rereadDeclinedReason: row.reread_declined_reason,
    wireBreaks: row.wire_breaks,
    wireBreakDetails: storedWireBreaks(row.wire_break_details),
    remarks: row.remarks,
    deviceTime: new Date(row.device_time).toISOString(),
    deviceTimeZone: row.device_time_zone,
    receivedAt: new Date(row.received_at).toISOString(),
    authorUserId: row.author_user_id,
    authorName: row.author_name,
    restressOfDispositionId: row.restress_of_disposition_id,
  };
}
