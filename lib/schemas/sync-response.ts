import { z } from "zod/mini";
import { ERROR_STATUS, type ErrorCode } from "@/lib/errors";
import {
  COMPARISON_BASES,
  DECISIONS,
  GOVERNING_VALUES,
  READING_METHODS,
  STORED_RESOLUTIONS,
  STRESSING_ENDS,
  STRESSING_ORDERS,
  TENDON_ENDS,
  UNIT_SYSTEMS,
  VERDICTS,
} from "./domain";
import type { Disposition } from "./disposition";
import type { Flag } from "./flag";
import type { StressingRecord } from "./record";

/**
 * What the server answers the tablet, as zod schemas: the route handlers build their answer
 * through these (`route({ response })` parses before sending) and the tablet parses what it
 * receives before storing anything (`lib/offline/sync-client.ts`). The TypeScript types are
 * derived from them, so the contract is written once.
 *
 * Written with zod/mini: the tablet loads these in its sync chunk, and the mini build keeps that
 * chunk small. Unknown keys are dropped on parse, so the tablet stores exactly the contract: a
 * field the server starts to send is added here first. Fields marked optional were absent from
 * older servers (the tablet still holds rows pulled from them).
 */

const id = z.string();
const nullableNumber = z.nullable(z.number());
const nullableString = z.nullable(z.string());
const end = z.enum(TENDON_ENDS);
const verdict = z.enum(VERDICTS);
const stressingOrder = z.optional(z.nullable(z.enum(STRESSING_ORDERS)));
const enteredPressure = z.object({ pressure: z.string(), unit: z.enum(["psi", "MPa"]) });

// ---------------------------------------------------------------------------------------------
// Push: one answer per operation.

const OP_ERROR_CODES = [...(Object.keys(ERROR_STATUS) as ErrorCode[]), "RELEASED", "RETRY_LATER"] as const;

export const opErrorSchema = z.object({
  code: z.enum(OP_ERROR_CODES),
  message: z.string(),
  fields: z.optional(z.record(z.string(), z.array(z.string()))),
});
export type OpError = z.infer<typeof opErrorSchema>;

/** The server's verdict on the tendon after the op, for the tablet's list. */
export const opEvaluationSchema = z.object({
  verdict,
  provisional: z.boolean(),
  deviationPct: nullableNumber,
  flagKinds: z.array(z.string()),
});
export type OpEvaluation = z.infer<typeof opEvaluationSchema>;

/** What the server found of a lift-off check (SI). */
export const fieldLiftoffResultSchema = z.object({
  liftoffForceN: z.number(),
  expectedForceN: z.number(),
  deviationPct: z.number(),
  bandPct: z.number(),
  withinBand: z.boolean(),
});
export type FieldLiftoffResult = z.infer<typeof fieldLiftoffResultSchema>;

export const opResultSchema = z.object({
  opId: id,
  /** "retry-later": nothing was stored for this op; the tablet keeps it and sends it again. */
  status: z.enum(["applied", "duplicate", "conflict", "rejected", "retry-later"]),
  /** Revision stored (applied/duplicate), or the server's current one (conflict). */
  revision: z.optional(z.number()),
  /** The chain's current head on a conflict, so the tablet can show what it lost to. */
  headRecordId: z.optional(id),
  evaluation: z.optional(opEvaluationSchema),
  /** A tails cut: whether the server found the tendon held when the cut arrived, and why. */
  tailCut: z.optional(z.object({ held: z.boolean(), reasons: z.array(z.string()) })),
  /** A lift-off check: the server's judgement of it. */
  liftoffCheck: z.optional(fieldLiftoffResultSchema),
  error: z.optional(opErrorSchema),
});
export type OpResult = z.infer<typeof opResultSchema>;

export const pushResponseSchema = z.object({ results: z.array(opResultSchema) });
export type PushResponse = z.infer<typeof pushResponseSchema>;

// ---------------------------------------------------------------------------------------------
// Pull and download: reference data and record states, as the server sends them.

export const fieldProjectSchema = z.object({
  id,
  code: z.string(),
  name: z.string(),
  unitSystem: z.enum(UNIT_SYSTEMS),
  readingResolution: z.enum(STORED_RESOLUTIONS),
  tolerancePct: z.number(),
  shortTendonFloorMm: nullableNumber,
  comparisonBasis: z.enum(COMPARISON_BASES),
  countJackGrip: z.boolean(),
  frictionMu: z.number(),
  wobblePerM: z.number(),
  anchorSetMm: z.number(),
  blindEntry: z.boolean(),
  /** The project's time zone: the stressing day on the tablet is the day there. */
  timeZone: z.optional(z.string()),
  jackingForceFactor: z.optional(z.number()),
  underForcePct: z.optional(z.number()),
  seatingExcessMm: z.optional(z.number()),
  /** The concrete strength the project requires before stressing (MPa), null when it sets none. */
  requiredConcreteMPa: z.optional(nullableNumber),
  /** Which prediction governs the verdict (projectBasisFromRow names it `governing`). */
  governing: z.optional(z.enum(GOVERNING_VALUES)),
});
export type FieldProject = z.infer<typeof fieldProjectSchema>;

export const fieldPourSchema = z.object({
  id,
  projectId: id,
  name: z.string(),
  level: nullableString,
  plannedStressingDate: nullableString,
  /** Derived on the server: planned, stressing, stressed or released. */
  status: z.string(),
  /** The standing release: while it is set the pour takes no record. */
  release: z.nullable(z.object({ by: z.string(), at: z.string(), statement: z.string() })),
  /** The last time the engineer reopened a release, with the reason. */
  reopened: z.nullable(z.object({ by: z.string(), at: z.string(), reason: z.string() })),
  /** The pour's confirmed concrete strength (MPa) from the lab's results, null until confirmed. */
  concreteStrengthMPa: z.optional(nullableNumber),
});
export type FieldPour = z.infer<typeof fieldPourSchema>;

export const fieldTendonSchema = z.object({
  id,
  projectId: id,
  pourId: id,
  tag: z.string(),
  kind: z.string(),
  strandSize: z.string(),
  strandCount: z.number(),
  segments: z.array(z.object({ lengthMm: z.number(), angleRad: z.number() })),
  ends: z.enum(STRESSING_ENDS),
  jackGripMm: nullableNumber,
  strandLotId: nullableString,
  /** The approved shop-drawing elongation of the whole tendon, when the schedule gives one. */
  shopElongationMm: z.optional(nullableNumber),
  /** How the schedule says a two-end tendon is stressed (absent in pulls before it existed). */
  stressingOrder,
  /**
   * The schedule's specified jacking force, N; null: the project's factor of fpu·A (absent in pulls
   * before it existed). The tablet's target pressure and judge read it as the server's do.
   */
  jackingForceN: z.optional(nullableNumber),
});
export type FieldTendon = z.infer<typeof fieldTendonSchema>;

export const fieldStrandLotSchema = z.object({
  id,
  projectId: id,
  lotNumber: z.string(),
  strandSize: z.string(),
  areaMm2: z.number(),
  modulusMPa: z.number(),
  breakingLoadN: z.number(),
});
export type FieldStrandLot = z.infer<typeof fieldStrandLotSchema>;

export const fieldEquipmentSetSchema = z.object({
  id,
  projectId: id,
  name: z.string(),
  jackSerial: z.string(),
  gaugeSerial: z.string(),
  jackGripMm: nullableNumber,
  maxForceN: z.optional(nullableNumber),
  /** Draw-in per re-grip for ram-travel records that type none (absent in pulls before it existed). */
  drawInMm: z.optional(nullableNumber),
});
export type FieldEquipmentSet = z.infer<typeof fieldEquipmentSetSchema>;

/**
 * A calibration as the tablet keeps it: the part of the one calibration DTO (`Calibration` in
 * lib/schemas/calibration.ts) that picks and applies it. The pull is built from the whole DTO and
 * this schema keeps that part only.
 */
export const fieldCalibrationSchema = z.object({
  id,
  projectId: id,
  equipmentSetId: id,
  calibratedOn: z.string(),
  validUntil: z.string(),
  slope: z.number(),
  intercept: z.number(),
  minPressureMPa: z.number(),
  maxPressureMPa: z.number(),
  /** Retired or corrected: never picked again (`pickCalibration`). */
  retiredAt: z.optional(nullableString),
  /** The calibration that corrects this one. */
  replacedBy: z.optional(nullableString),
});
export type FieldCalibration = z.infer<typeof fieldCalibrationSchema>;

const wireBreakDetailSchema = z.object({
  strand: nullableNumber,
  where: z.enum(["jack_end", "far_end", "along_length", "not_known"]),
});

/** A stored record revision, as the server holds it. */
export const fieldRecordSchema = z.object({
  id,
  projectId: id,
  pourId: id,
  tendonId: id,
  tendonEnd: end,
  chainId: id,
  revision: z.number(),
  baseRecordId: nullableString,
  revisionReason: nullableString,
  equipmentSetId: id,
  calibrationId: nullableString,
  initialPressureMPa: nullableNumber,
  finalPressureMPa: z.number(),
  readingMethod: z.enum(READING_METHODS),
  entered: z.unknown(),
  measuredMm: z.number(),
  seatingMm: nullableNumber,
  drawInMm: z.optional(nullableNumber),
  stressingOrder,
  /** The first reading when the elongation was read again finer (absent in pulls before it existed). */
  firstReadingMm: z.optional(nullableNumber),
  rereadDeclinedReason: z.optional(nullableString),
  wireBreaks: z.number(),
  wireBreakDetails: z.optional(z.array(wireBreakDetailSchema)),
  remarks: nullableString,
  deviceTime: z.string(),
  authorUserId: id,
  authorName: z.string(),
});
export type FieldRecord = z.infer<typeof fieldRecordSchema>;

/**
 * A record as the pull sends it, made from the DTO: broken wires absent rather than null (records
 * made before they were asked). The route's parse keeps the contract's part of the rest.
 */
export function fieldRecordFrom(record: StressingRecord): FieldRecord {
  return { ...record, wireBreakDetails: record.wireBreakDetails ?? undefined };
}

export const fieldEvaluationSchema = z.object({
  id,
  tendonId: id,
  verdict,
  provisional: z.boolean(),
  deviationPct: nullableNumber,
  createdAt: z.string(),
  /** The records the evaluation judged (absent from servers before the gauge check on the tablet). */
  recordIds: z.optional(z.array(id)),
});
export type FieldEvaluation = z.infer<typeof fieldEvaluationSchema>;

/** The engineer's decision on a flag, as the crew needs it at the slab edge. */
export const fieldDispositionSchema = z.object({
  /** Absent from servers that predate lift-off checks. */
  id: z.optional(id),
  decision: z.enum(DECISIONS),
  reasons: z.string(),
  engineerName: z.string(),
  createdAt: z.string(),
});
export type FieldDisposition = z.infer<typeof fieldDispositionSchema>;

export const fieldFlagSchema = z.object({
  id,
  tendonId: id,
  kind: z.string(),
  status: z.string(),
  /** Why the flag was raised, in words (absent on flags pulled before it was synced). */
  reason: z.optional(z.string()),
  createdAt: z.optional(z.string()),
  /** Oldest first. */
  dispositions: z.optional(z.array(fieldDispositionSchema)),
});
export type FieldFlag = z.infer<typeof fieldFlagSchema>;

/** A flag as the pull sends it, made from the DTOs: the engineer's decisions on it (oldest first) inside it. */
export function fieldFlagFrom(flag: Flag, dispositions: Disposition[]): FieldFlag {
  return { ...flag, dispositions };
}

/** Tails cut on a tendon, as the server stored it. */
export const fieldTailCutSchema = z.object({
  id,
  projectId: id,
  pourId: id,
  tendonId: id,
  cutAt: z.string(),
  cutByName: z.string(),
  /** Why the tendon was held when the cut reached the server; empty when it was clear. */
  heldReasons: z.array(z.string()),
});
export type FieldTailCut = z.infer<typeof fieldTailCutSchema>;

/** A lift-off check as the server stored and judged it. */
export const fieldLiftoffCheckSchema = z.extend(fieldLiftoffResultSchema, {
  id,
  projectId: id,
  pourId: id,
  tendonId: id,
  dispositionId: id,
  tendonEnd: end,
  equipmentSetId: id,
  pressureMPa: z.number(),
  /** The pressure as typed, e.g. "5950" with unit psi. */
  entered: enteredPressure,
  checkedAt: z.string(),
  checkedByName: z.string(),
});
export type FieldLiftoffCheck = z.infer<typeof fieldLiftoffCheckSchema>;

/** A detension as the server stored it, answering the disposition that ordered it. */
export const fieldDetensionSchema = z.object({
  id,
  projectId: id,
  pourId: id,
  tendonId: id,
  dispositionId: id,
  detensionedAt: z.string(),
  operatorName: z.string(),
  equipmentSetId: id,
  /** The gauge pressure at release as typed, null when it was not read. */
  entered: z.nullable(enteredPressure),
  releasePressureMPa: nullableNumber,
  strandsDetensioned: z.number(),
  remarks: nullableString,
  recordedByName: z.string(),
});
export type FieldDetension = z.infer<typeof fieldDetensionSchema>;

export const tombstoneSchema = z.object({ table: z.string(), id });
export type Tombstone = z.infer<typeof tombstoneSchema>;

export const pullResponseSchema = z.object({
  /** The server's cursor is xid8 as decimal text. */
  cursor: z.string().check(z.regex(/^\d{1,20}$/)),
  serverTime: z.string(),
  projects: z.array(fieldProjectSchema),
  pours: z.array(fieldPourSchema),
  tendons: z.array(fieldTendonSchema),
  strandLots: z.array(fieldStrandLotSchema),
  equipmentSets: z.array(fieldEquipmentSetSchema),
  calibrations: z.array(fieldCalibrationSchema),
  records: z.array(fieldRecordSchema),
  evaluations: z.array(fieldEvaluationSchema),
  flags: z.array(fieldFlagSchema),
  /** Absent from servers that predate tails cut. */
  tailCuts: z.optional(z.array(fieldTailCutSchema)),
  /** Absent from servers that predate lift-off checks. */
  liftoffChecks: z.optional(z.array(fieldLiftoffCheckSchema)),
  /** Absent from servers that predate detensions. */
  detensions: z.optional(z.array(fieldDetensionSchema)),
  removed: z.array(tombstoneSchema),
  /** Pours asked for that the caller may no longer take out (removed, or not on their crew). */
  unavailable: z.array(id),
});
export type PullResponse = z.infer<typeof pullResponseSchema>;

/** A pull that brings nothing at a cursor (the pours asked for that the caller may not take out in `unavailable`). */
export function emptyPull(cursor: string, serverTime: string, unavailable: string[] = []): PullResponse {
  return {
    cursor,
    serverTime,
    projects: [],
    pours: [],
    tendons: [],
    strandLots: [],
    equipmentSets: [],
    calibrations: [],
    records: [],
    evaluations: [],
    flags: [],
    tailCuts: [],
    liftoffChecks: [],
    detensions: [],
    removed: [],
    unavailable,
  };
}

/**
 * The pull and the download as the server sends them: the contract above, plus the two concrete
 * strengths again under the spelling apps cached before the one MPa spelling read
 * (`requiredConcreteMpa`, `concreteStrengthMpa`). Such an app parses with its own schema, which
 * drops keys it does not know: without these it would store projects and pours with no concrete
 * gate, show none, and keep them so after its update (a pull sends a row again only when it
 * changes). What it stores under the old names, tablet database version 6 renames. Current apps
 * never see them: `pullResponseSchema` drops them on parse. Remove once every tablet runs an app
 * with database version 6.
 */
export const pullAnswerSchema = z.extend(pullResponseSchema, {
  projects: z.array(z.extend(fieldProjectSchema, { requiredConcreteMpa: z.optional(nullableNumber) })),
  pours: z.array(z.extend(fieldPourSchema, { concreteStrengthMpa: z.optional(nullableNumber) })),
});
export type PullAnswer = z.infer<typeof pullAnswerSchema>;

/** A pull as the server sends it: the old spelling of the concrete strengths beside the new (see above). */
export const pullAnswer = (pull: PullResponse): PullAnswer => ({
  ...pull,
  projects: pull.projects.map((p) => ({ ...p, requiredConcreteMpa: p.requiredConcreteMPa })),
  pours: pull.pours.map((p) => ({ ...p, concreteStrengthMpa: p.concreteStrengthMPa })),
});

// ---------------------------------------------------------------------------------------------
// The pours a crew member may take out, for the download list.

export const availablePourSchema = z.object({
  id,
  projectId: id,
  projectCode: z.string(),
  projectName: z.string(),
  name: z.string(),
  level: nullableString,
  plannedStressingDate: nullableString,
  status: z.string(),
  tendonCount: z.number(),
});
export type AvailablePour = z.infer<typeof availablePourSchema>;

export const availablePoursResponseSchema = z.object({ pours: z.array(availablePourSchema) });
export type AvailablePoursResponse = z.infer<typeof availablePoursResponseSchema>;
