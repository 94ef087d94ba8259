import { describe, expect, it } from "vitest";
import {
  deriveFromEntered,
  EMPTY_RECORD_FORM,
  payloadFromForm,
  recordFormSchema,
  recordFromRow,
  recordPayloadSchema,
  type Entered,
  type RecordRow,
} from "./record";
import { CONTROL_CHARACTERS_MESSAGE } from "./text";
import { fieldRecordFrom, fieldRecordSchema } from "./sync-response";
import { MM_PER_INCH } from "@/lib/units";

// Conversion factors are exact by definition: 1 in = 25.4 mm (NIST SP 811, B.8);
// 1 psi = 6.894 757 kPa (NIST SP 811, B.8, to seven figures).
const US: Entered["units"] = { length: "in", pressure: "psi" };

/** What payloadFromForm needs besides the form: a first revision by one crew member, in inches and psi. */
const ctx = {
  units: US,
  projectId: "0190a0b0-0000-7000-8000-0000000000aa",
  pourId: "0190a0b0-0000-7000-8000-0000000000bb",
  tendonId: "0190a0b0-0000-7000-8000-0000000000cc",
  chainId: "0190a0b0-0000-7000-8000-0000000000ee",
  revision: 1,
  baseRecordId: null,
  calibrationId: null,
  expired: false,
  authorUserId: "0190a0b0-0000-7000-8000-000000000001",
  now: new Date("2026-12-02T15:30:00Z"),
  timeZone: "UTC",
};

/** A complete form read by marks in inches and psi (end A), with the given boxes changed. */
function filledForm<T extends object = object>(changes: T = {} as T) {
  return {
    ...EMPTY_RECORD_FORM,
    equipmentSetId: "0190a0b0-0000-7000-8000-0000000000dd",
    finalPressure: "4200",
    marksBefore: "0",
    marksAfter: "4 1/2",
    ...changes,
  };
}

/** The form's own context for a tendon stressed at end A, no correction, no expired set. */
const formContext = { units: US, expiredSetIds: [] as string[], ends: ["A"] as const, correction: false };

describe("deriveFromEntered", () => {
  it("reads marks in fractional inches and gauge pressure in psi into mm and MPa", () => {
    const { values, problems } = deriveFromEntered(
      {
        units: US,
        initialPressure: "1000",
        finalPressure: "4227",
        marks: { before: "1 1/4", after: "8 3/8" },
        strokes: null,
        seating: "1/4",
      },
      "marks",
    );
    expect(problems).toEqual([]);
    // 1 in = 25.4 mm exactly (NIST SP 811, B.8), the factor lib/units holds
    expect(values!.measuredMm).toBeCloseTo((8.375 - 1.25) * MM_PER_INCH, 9); // 180.975 mm
    expect(values!.finalPressureMPa).toBeCloseTo(29.1441, 4); // 4227 × 6.894757 kPa
    // eslint-disable-next-line tautline/no-unit-factor-literal -- 1000 psi = 6.894757 MPa (NIST SP 811, B.8)
    expect(values!.initialPressureMPa).toBeCloseTo(6.894757, 5);
    expect(values!.seatingMm).toBeCloseTo(6.35, 9);
  });

  it("sums ram strokes", () => {
    const { values } = deriveFromEntered(
      {
        units: { length: "mm", pressure: "MPa" },
        initialPressure: null,
        finalPressure: "29.1",
        marks: null,
        strokes: ["180", "95.5"],
        seating: null,
      },
      "strokes",
    );
    expect(values!.measuredMm).toBe(275.5);
  });

  it("names each box that does not read", () => {
    const { values, problems } = deriveFromEntered(
      {
        units: US,
        initialPressure: "5000",
        finalPressure: "4000",
        marks: { before: "3", after: "2" },
        strokes: null,
        seating: "abc",
      },
      "marks",
    );
    expect(values).toBeNull();
    expect(problems.map((p) => p.field).sort()).toEqual(["initialPressure", "marksAfter", "seating"]);
  });
});

describe("recordFormSchema", () => {
  const context = { ...formContext, expiredSetIds: ["set-old"] };

  it("accepts a complete form", () => {
    const ok = recordFormSchema({ ...context, ends: ["A"] }).safeParse(filledForm({ equipmentSetId: "set-new" }));
    expect(ok.success).toBe(true);
  });

  it("wants a reason for an expired set, a reason for a correction, an end the tendon has, and readable strokes", () => {
    const result = recordFormSchema({ ...context, ends: ["A"], correction: true }).safeParse({
      ...EMPTY_RECORD_FORM,
      tendonEnd: "B",
      equipmentSetId: "set-old",
      readingMethod: "strokes",
      finalPressure: "4200",
      strokes: [{ value: "6" }, { value: "two" }],
    });
    expect(result.success).toBe(false);
    const paths = result.error!.issues.map((i) => i.path.join("."));
    expect(paths.sort()).toEqual(["expiredCalibrationReason", "revisionReason", "strokes.1.value", "tendonEnd"]);
  });

  it("wants a reason to go ahead while the pour's concrete is not confirmed, and only then", () => {
    const form = filledForm({ equipmentSetId: "set-new" });
    const gated = recordFormSchema({ ...context, concreteUnconfirmed: true });
    const refused = gated.safeParse(form);
    expect(refused.success).toBe(false);
    expect(refused.error!.issues).toEqual([
      expect.objectContaining({
        path: ["concreteGoAhead"],
        message: expect.stringMatching(/who confirmed it on site/),
      }),
    ]);
    expect(gated.safeParse({ ...form, concreteGoAhead: "Inspector read the cylinders at 3,200 psi." }).success).toBe(
      true,
    );
    expect(recordFormSchema(context).safeParse(form).success).toBe(true);
  });
});

describe("the reason to go ahead before the concrete is confirmed, in the payload", () => {
  const form = filledForm({ concreteGoAhead: "Inspector read the cylinders at 3,200 psi." });

  it("travels with the record only while the gate is not met, and the server's schema reads it", () => {
    const gated = payloadFromForm(form, { ...ctx, concreteUnconfirmed: true });
    expect(gated.concreteGoAhead).toBe("Inspector read the cylinders at 3,200 psi.");
    expect(recordPayloadSchema.safeParse(gated).success).toBe(true);
    expect(payloadFromForm(form, ctx)).not.toHaveProperty("concreteGoAhead");
  });

  it("is refused when too short, naming the field", () => {
    const short = { ...payloadFromForm(form, { ...ctx, concreteUnconfirmed: true }), concreteGoAhead: "ok" };
    const result = recordPayloadSchema.safeParse(short);
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => i.path.join("."))).toEqual(["concreteGoAhead"]);
  });
});

describe("the finer second reading", () => {
  const base = filledForm({ marksBefore: "1", marksAfter: "5 1/2" });

  it("marks: the mark after read again is judged, the first reading kept beside it", () => {
    const payload = payloadFromForm({ ...base, rereadMarksAfter: "5 7/16" }, ctx);
    // 1 in = 25.4 mm exactly (NIST SP 811, B.8): 4 1/2 in first, 4 7/16 in again.
    expect(payload.firstReadingMm).toBeCloseTo(4.5 * MM_PER_INCH, 9);
    expect(payload.measuredMm).toBeCloseTo(4.4375 * MM_PER_INCH, 9);
    expect(payload.entered.marks).toEqual({ before: "1", after: "5 1/2" });
    expect(payload.entered.reread).toEqual({ marksAfter: "5 7/16", strokes: null });
    expect(payload.rereadDeclinedReason).toBeNull();
    expect(recordPayloadSchema.safeParse(payload).success).toBe(true);
  });

  it("ram strokes: each stroke read again, summed; a stroke not read again is named", () => {
    const strokes = {
      ...base,
      readingMethod: "strokes" as const,
      strokes: [{ value: "6" }, { value: "2 1/4" }],
    };
    const payload = payloadFromForm({ ...strokes, rereadStrokes: [{ value: "6" }, { value: "2 3/16" }] }, ctx);
    expect(payload.firstReadingMm).toBeCloseTo(8.25 * MM_PER_INCH, 9);
    expect(payload.measuredMm).toBeCloseTo(8.1875 * MM_PER_INCH, 9);
    const missing = recordFormSchema(formContext).safeParse({
      ...strokes,
      rereadStrokes: [{ value: "6" }, { value: "" }],
    });
    expect(missing.success).toBe(false);
    expect(missing.error!.issues.map((i) => i.path.join("."))).toEqual(["rereadStrokes.1.value"]);
  });

  it("once asked, the form wants the re-read or a reason, and not both", () => {
    const asked = recordFormSchema({ ...formContext, rereadAsked: true });
    const neither = asked.safeParse(base);
    expect(neither.success).toBe(false);
    expect(neither.error!.issues.map((i) => i.path.join("."))).toEqual(["rereadDeclinedReason"]);
    expect(asked.safeParse({ ...base, rereadDeclinedReason: "tails already cut" }).success).toBe(true);
    expect(asked.safeParse({ ...base, rereadMarksAfter: "5 7/16" }).success).toBe(true);
    const both = asked.safeParse({ ...base, rereadMarksAfter: "5 7/16", rereadDeclinedReason: "tails cut" });
    expect(both.success).toBe(false);
    expect(both.error!.issues.map((i) => i.path.join("."))).toEqual(["rereadDeclinedReason"]);
  });

  it("the server refuses a first reading that the typed values do not give, and a reason beside a re-read", () => {
    const payload = payloadFromForm({ ...base, rereadMarksAfter: "5 7/16" }, ctx);
    const forged = recordPayloadSchema.safeParse({ ...payload, firstReadingMm: payload.measuredMm });
    expect(forged.success).toBe(false);
    expect(forged.error!.issues.map((i) => i.path.join("."))).toEqual(["firstReadingMm"]);
    const both = recordPayloadSchema.safeParse({ ...payload, rereadDeclinedReason: "tails already cut" });
    expect(both.success).toBe(false);
    expect(both.error!.issues.map((i) => i.path.join("."))).toEqual(["rereadDeclinedReason"]);
    const declined = payloadFromForm({ ...base, rereadDeclinedReason: "tails already cut" }, ctx);
    expect(declined.firstReadingMm).toBeNull();
    expect(declined.rereadDeclinedReason).toBe("tails already cut");
    expect(recordPayloadSchema.safeParse(declined).success).toBe(true);
  });
});

describe("wire breaks: which strand and where", () => {
  const base = filledForm({
    wireBreaks: "2",
    wireBreakDetails: [
      { strand: "3", strandNotKnown: false, where: "jack_end" as const },
      { strand: "", strandNotKnown: true, where: "along_length" as const },
    ],
  });
  const fourStrands = { ...formContext, strandCount: 4 };

  it("travels one entry per broken wire, a strand not known as null", () => {
    expect(recordFormSchema(fourStrands).safeParse(base).success).toBe(true);
    const payload = payloadFromForm(base, ctx);
    expect(payload.wireBreakDetails).toEqual([
      { strand: 3, where: "jack_end" },
      { strand: null, where: "along_length" },
    ]);
    expect(recordPayloadSchema.safeParse(payload).success).toBe(true);
  });

  it("names the box: a strand the tendon does not have, a strand left blank, a place not chosen", () => {
    const bad = recordFormSchema(fourStrands).safeParse({
      ...base,
      wireBreakDetails: [
        { strand: "5", strandNotKnown: false, where: "far_end" },
        { strand: "", strandNotKnown: false, where: "" },
      ],
    });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["wireBreakDetails.0.strand", "Break 1: this tendon has 4 strands."],
      ["wireBreakDetails.1.strand", 'Break 2: type the strand\'s number, or press "Not known".'],
      ["wireBreakDetails.1.where", "Break 2: say where the wire broke."],
    ]);
  });

  it("the server refuses details that do not match the count", () => {
    const payload = payloadFromForm(base, ctx);
    const short = recordPayloadSchema.safeParse({ ...payload, wireBreakDetails: payload.wireBreakDetails!.slice(1) });
    expect(short.success).toBe(false);
    expect(short.error!.issues.map((i) => i.path.join("."))).toEqual(["wireBreakDetails"]);
    const place = recordPayloadSchema.safeParse({
      ...payload,
      wireBreakDetails: [{ strand: 1, where: "somewhere" }, payload.wireBreakDetails![1]],
    });
    expect(place.success).toBe(false);
    expect(place.error!.issues.map((i) => i.path.join("."))).toEqual(["wireBreakDetails.0.where"]);
  });
});

describe("gauge steps", () => {
  const base = filledForm({
    initialPressure: "800",
    finalPressure: "4000",
    marksBefore: "1",
    marksAfter: "5 1/2",
    gaugeSteps: [
      { pressure: "800", reading: "1" },
      { pressure: "1600", reading: "2 1/4" },
      { pressure: "", reading: "" },
      { pressure: "2400", reading: "3 1/2" },
    ],
  });
  const issues = (values: typeof base) => {
    const r = recordFormSchema(formContext).safeParse(values);
    return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
  };

  it("travel as typed with their SI values, blank rows dropped, and the server's schema reads them", () => {
    expect(issues(base)).toEqual([]);
    const payload = payloadFromForm(base, ctx);
    expect(payload.entered.gaugeSteps).toHaveLength(3);
    // 2 1/4 in = 57.15 mm; 1600 psi = 11.0316 MPa (NIST SP 811, B.8)
    expect(payload.entered.gaugeSteps![1]!.reading).toBe("2 1/4");
    expect(payload.entered.gaugeSteps![1]!.readingMm).toBeCloseTo(2.25 * MM_PER_INCH, 9);
    expect(payload.entered.gaugeSteps![1]!.pressureMPa).toBeCloseTo(11.0316, 4);
    expect(recordPayloadSchema.safeParse(payload).success).toBe(true);
  });

  it("name the row and box: one pressure only, a reading that falls, a box left blank, no initial pressure", () => {
    const same = {
      ...base,
      gaugeSteps: [
        { pressure: "800", reading: "1" },
        { pressure: "800", reading: "2" },
      ],
    };
    expect(issues(same)).toEqual(["gaugeSteps.1.pressure: Gauge steps need at least two different pressures."]);
    const falls = {
      ...base,
      gaugeSteps: [
        { pressure: "800", reading: "2" },
        { pressure: "", reading: "" },
        { pressure: "1600", reading: "1" },
      ],
    };
    expect(issues(falls)).toEqual([
      "gaugeSteps.2.reading: The reading must grow with the pressure: it is not above the step below it.",
    ]);
    const blank = {
      ...base,
      gaugeSteps: [
        { pressure: "800", reading: "1" },
        { pressure: "1600", reading: "" },
      ],
    };
    expect(issues(blank)).toEqual(["gaugeSteps.1.reading: Type a value here."]);
    expect(issues({ ...base, initialPressure: "" })).toEqual([
      "initialPressure: With gauge steps, type the initial pressure the elongation was read from (usually the first step's).",
    ]);
  });

  it("the server refuses SI values the typed steps do not give, and unknown keys in a step", () => {
    const payload = payloadFromForm(base, ctx);
    const forged = {
      ...payload,
      entered: {
        ...payload.entered,
        gaugeSteps: payload.entered.gaugeSteps!.map((s, i) => (i === 2 ? { ...s, readingMm: 1 } : s)),
      },
    };
    const r = recordPayloadSchema.safeParse(forged);
    expect(r.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`)).toEqual([
      "entered.gaugeSteps.2.readingMm: Gauge step 3: the reading does not match the value as typed.",
    ]);
    const extra = {
      ...payload,
      entered: { ...payload.entered, gaugeSteps: [{ ...payload.entered.gaugeSteps![0]!, force: 3 }] },
    };
    expect(recordPayloadSchema.safeParse(extra).success).toBe(false);
  });
});

describe("the gauge off its target, confirmed", () => {
  const form = filledForm({ finalPressure: "4600" });

  it("travels as a field of the record, not in the remarks", () => {
    const p = payloadFromForm(form, { ...ctx, gaugeOffTarget: { pct: 9.5, reason: "needle stuck, read twice" } });
    expect(p.entered.gaugeOffTarget).toEqual({ pct: 9.5, reason: "needle stuck, read twice" });
    expect(p.remarks).toBeNull();
    expect(recordPayloadSchema.safeParse(p).success).toBe(true);
  });

  it("is refused without a reason, naming the field", () => {
    const p = payloadFromForm(form, ctx);
    const r = recordPayloadSchema.safeParse({
      ...p,
      entered: { ...p.entered, gaugeOffTarget: { pct: 9.5, reason: "" } },
    });
    expect(r.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`)).toEqual([
      "entered.gaugeOffTarget.reason: Say in a few words why the gauge is off its target.",
    ]);
  });

  // The confirmation's schema is written with zod/mini (./stored-entered.ts) inside this full-API one.
  it("is refused with a control character in the reason, or a distance out of range, naming the field", () => {
    const p = payloadFromForm(form, ctx);
    const refused = (gaugeOffTarget: unknown) =>
      recordPayloadSchema
        .safeParse({ ...p, entered: { ...p.entered, gaugeOffTarget } })
        .error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(refused({ pct: 9.5, reason: "needle\u0000 stuck" })).toEqual([
      `entered.gaugeOffTarget.reason: ${CONTROL_CHARACTERS_MESSAGE}`,
    ]);
    expect(refused({ pct: -120, reason: "needle stuck" })).toEqual([
      "entered.gaugeOffTarget.pct: The gauge cannot be more than 100 % below its target.",
    ]);
    expect(refused({ pct: 9.5, reason: "needle stuck", by: "crew" })).toHaveLength(1);
  });

  it("keeps the reason trimmed, and no confirmation at all is allowed", () => {
    const p = payloadFromForm(form, ctx);
    const parsed = recordPayloadSchema.parse({
      ...p,
      entered: { ...p.entered, gaugeOffTarget: { pct: 9.5, reason: "  needle stuck  " } },
    });
    expect(parsed.entered.gaugeOffTarget).toEqual({ pct: 9.5, reason: "needle stuck" });
    expect(recordPayloadSchema.safeParse({ ...p, entered: { ...p.entered, gaugeOffTarget: null } }).success).toBe(true);
  });
});

describe("recordFromRow and the pull's record", () => {
  const row: RecordRow = {
    id: "r1",
    project_id: "p1",
    pour_id: "o1",
    tendon_id: "t1",
    tendon_end: "A",
    chain_id: "c1",
    revision: 2,
    base_record_id: "r0",
    revision_reason: "Mark after misread",
    equipment_set_id: "s1",
    calibration_id: "k1",
    expired_calibration_reason: null,
    concrete_go_ahead: "Cylinders read on site",
    initial_pressure_mpa: 3.5,
    final_pressure_mpa: 28.5,
    reading_method: "marks",
    entered: { finalPressure: "28.5" },
    measured_mm: 112,
    seating_mm: 6,
    draw_in_mm: null,
    stressing_order: null,
    first_reading_mm: null,
    reread_declined_reason: null,
    wire_breaks: 1,
    wire_break_details: [{ strand: 3, where: "jack_end" }],
    remarks: null,
    device_time: new Date("2026-12-02T09:00:00Z"),
    device_time_zone: "America/Chicago",
    received_at: "2026-12-02T09:05:00+00:00",
    author_user_id: "u1",
    author_name: "Crew One",
    restress_of_disposition_id: null,
  };

  it("names every column in the DTO's words, instants as ISO text whether read as Date or text", () => {
    expect(recordFromRow(row)).toEqual({
      id: "r1",
      projectId: "p1",
      pourId: "o1",
      tendonId: "t1",
      tendonEnd: "A",
      chainId: "c1",
      revision: 2,
      baseRecordId: "r0",
      revisionReason: "Mark after misread",
      equipmentSetId: "s1",
      calibrationId: "k1",
      expiredCalibrationReason: null,
      concreteGoAhead: "Cylinders read on site",
      initialPressureMPa: 3.5,
      finalPressureMPa: 28.5,
      readingMethod: "marks",
      entered: { finalPressure: "28.5" },
      measuredMm: 112,
      seatingMm: 6,
      drawInMm: null,
      stressingOrder: null,
      firstReadingMm: null,
      rereadDeclinedReason: null,
      wireBreaks: 1,
      wireBreakDetails: [{ strand: 3, where: "jack_end" }],
      remarks: null,
      deviceTime: "2026-12-02T09:00:00.000Z",
      deviceTimeZone: "America/Chicago",
      receivedAt: "2026-12-02T09:05:00.000Z",
      authorUserId: "u1",
      authorName: "Crew One",
      restressOfDispositionId: null,
    });
  });

  it("reads broken wires it cannot read as none rather than passing them on", () => {
    const odd = recordFromRow({ ...row, wire_break_details: [{ strand: "three", where: "somewhere" }] as never });
    expect(odd.wireBreakDetails).toBeNull();
  });

  it("sends the tablet the contract's part, broken wires absent when the record has none", () => {
    const sent = fieldRecordSchema.parse(fieldRecordFrom(recordFromRow({ ...row, wire_break_details: null })));
    expect(sent.wireBreakDetails).toBeUndefined();
    expect(sent).not.toHaveProperty("concreteGoAhead");
    expect(sent).not.toHaveProperty("receivedAt");
    expect(sent).toMatchObject({ id: "r1", revision: 2, measuredMm: 112, authorName: "Crew One" });
    expect(fieldRecordFrom(recordFromRow(row)).wireBreakDetails).toEqual([{ strand: 3, where: "jack_end" }]);
  });
});
