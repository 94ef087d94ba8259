import { z } from "zod";
import type { OpErrorCode } from "@/lib/errors";
import type { Decision } from "./domain";

/**
 * The sync protocol between the tablet's outbox and the server, shared by the sync client and
 * the route handlers. Each operation carries a client-made id that is a permanent idempotency
 * key: the server answers applied | duplicate | conflict | rejected per operation.
 */

/**
 * create and revise carry a stressing record; tails_cut records a tendon's tails cut
 * (lib/schemas/tail-cut.ts); liftoff_check a lift-off check ordered by a disposition (lib/schemas/liftoff.ts);
 * detension a detension ordered by a disposition (lib/schemas/detension.ts).
 */
export const OP_KINDS = ["create", "revise", "tails_cut", "liftoff_check", "detension"] as const;
export type OpKind = (typeof OP_KINDS)[number];

/** "retry-later": nothing was stored for this op; the tablet keeps it and sends it again. */
export const OP_STATUSES = ["applied", "duplicate", "conflict", "rejected", "retry-later"] as const;
export type OpStatus = (typeof OP_STATUSES)[number];

/** Most operations one push may carry; the client sends batches of 25–50. */
export const MAX_OPS_PER_PUSH = 100;

export const deviceIdSchema = z
  .string({ error: "Send the device id." })
  .regex(/^[A-Za-z0-9_-]{8,64}$/, "The device id is 8 to 64 letters, digits, dashes or underscores.");

/** The envelope of one operation; its payload is checked per operation, so one bad op spoils only itself. */
export const syncOpSchema = z
  .object({
    opId: z.uuid({ error: "Each operation needs a UUID opId." }),
    kind: z.enum(OP_KINDS, {
      error: "The kind of operation must be create, revise, tails_cut, liftoff_check or detension.",
    }),
    recordId: z.uuid({ error: "Each operation needs the record's UUID." }),
    baseVersion: z.number().int().min(1).optional(),
    payload: z.unknown(),
  })
  .strict();
export type SyncOp = z.infer<typeof syncOpSchema>;

export const pushRequestSchema = z
  .object({
    deviceId: deviceIdSchema,
    ops: z
      .array(syncOpSchema, { error: "Send the operations as a list." })
      .min(1, "Send at least one operation.")
      .max(MAX_OPS_PER_PUSH, `Send at most ${MAX_OPS_PER_PUSH} operations at a time.`),
  })
  .strict()
  .superRefine((body, ctx) => {
    const seen = new Set<string>();
    body.ops.forEach((op, i) => {
      if (seen.has(op.opId))
        ctx.addIssue({ code: "custom", path: ["ops", i, "opId"], message: "The same opId appears twice in one push." });
      seen.add(op.opId);
    });
  });
export type PushRequest = z.infer<typeof pushRequestSchema>;

export interface OpError {
  code: OpErrorCode;
  message: string;
  fields?: Record<string, string[]>;
}

/** The server's verdict on the tendon after the op, for the tablet's list. */
export interface OpEvaluation {
  verdict: "in band" | "long" | "short" | "incomplete";
  provisional: boolean;
  deviationPct: number | null;
  flagKinds: string[];
}

export interface OpResult {
  opId: string;
  status: OpStatus;
  /** Revision stored (applied/duplicate), or the server's current one (conflict). */
  revision?: number;
  /** The chain's current head on a conflict, so the tablet can show what it lost to. */
  headRecordId?: string;
  evaluation?: OpEvaluation;
  /** A tails cut: whether the server found the tendon held when the cut arrived, and why. */
  tailCut?: { held: boolean; reasons: string[] };
  /** A lift-off check: the server's judgement of it. */
  liftoffCheck?: FieldLiftoffResult;
  error?: OpError;
}

export interface PushResponse {
  results: OpResult[];
}

/** The server's cursor is xid8 as decimal text. "0" asks for everything. */
export const cursorSchema = z.string().regex(/^\d{1,20}$/, "The cursor is the number the last pull returned.");

export const pullQuerySchema = z.object({
  cursor: cursorSchema.default("0"),
  pours: z
    .string({ error: "Name the pours to pull, comma-separated." })
    .transform((s) =>
      s
        .split(",")
        .map((p) => p.trim())
        .filter(Boolean),
    )
    .pipe(
      z
        .array(z.uuid({ error: "Each pour must be a UUID." }))
        .min(1, "Name at least one pour.")
        .max(20, "Pull at most 20 pours at a time."),
    ),
});
export type PullQuery = z.infer<typeof pullQuerySchema>;

export const fieldPourParamsSchema = z.object({ pourId: z.uuid({ error: "Not a pour id." }) });

// ---------------------------------------------------------------------------------------------
// What the tablet stores: reference data and record states, as the server sends them.

export interface FieldProject {
  id: string;
  code: string;
  name: string;
  unitSystem: "us" | "si";
  readingResolution: string;
  tolerancePct: number;
  shortTendonFloorMm: number | null;
  comparisonBasis: "gross" | "net";
  countJackGrip: boolean;
  frictionMu: number;
  wobblePerM: number;
  anchorSetMm: number;
  blindEntry: boolean;
  /** The project's time zone: the stressing day on the tablet is the day there. */
  timeZone?: string;
  jackingForceFactor?: number;
  underForcePct?: number;
  seatingExcessMm?: number;
  /** The concrete strength the project requires before stressing (MPa), null when it sets none. */
  requiredConcreteMpa?: number | null;
  /** Which prediction governs the verdict (projectBasisFromRow names it `governing`). */
  governing?: "tautline" | "shop_drawing";
}

export interface FieldPour {
  id: string;
  projectId: string;
  name: string;
  level: string | null;
  plannedStressingDate: string | null;
  /** Derived on the server: planned, stressing, stressed or released. */
  status: string;
  /** The standing release: while it is set the pour takes no record. */
  release: { by: string; at: string; statement: string } | null;
  /** The last time the engineer reopened a release, with the reason. */
  reopened: { by: string; at: string; reason: string } | null;
  /** The pour's confirmed concrete strength (MPa) from the lab's results, null until confirmed. */
  concreteStrengthMpa?: number | null;
}

export interface FieldTendon {
  id: string;
  projectId: string;
  pourId: string;
  tag: string;
  kind: string;
  strandSize: string;
  strandCount: number;
  segments: { lengthMm: number; angleRad: number }[];
  ends: "A" | "B" | "both";
  jackGripMm: number | null;
  strandLotId: string | null;
  /** The approved shop-drawing elongation of the whole tendon, when the schedule gives one. */
  shopElongationMm?: number | null;
  /** How the schedule says a two-end tendon is stressed (absent in pulls before it existed). */
  stressingOrder?: "sequential" | "simultaneous" | null;
}

export interface FieldStrandLot {
  id: string;
  projectId: string;
  lotNumber: string;
  strandSize: string;
  areaMm2: number;
  modulusMPa: number;
  breakingLoadN: number;
}

export interface FieldEquipmentSet {
  id: string;
  projectId: string;
  name: string;
  jackSerial: string;
  gaugeSerial: string;
  jackGripMm: number | null;
  maxForceN?: number | null;
  /** Draw-in per re-grip for ram-travel records that type none (absent in pulls before it existed). */
  drawInMm?: number | null;
}

export interface FieldCalibration {
  id: string;
  projectId: string;
  equipmentSetId: string;
  calibratedOn: string;
  validUntil: string;
  slope: number;
  intercept: number;
  minPressureMPa: number;
  maxPressureMPa: number;
  /** Retired or corrected: never picked again (`pickCalibration`). */
  retiredAt?: string | null;
  /** The calibration that corrects this one. */
  replacedBy?: string | null;
}

/** A stored record revision, as the server holds it. */
export interface FieldRecord {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  tendonEnd: "A" | "B";
  chainId: string;
  revision: number;
  baseRecordId: string | null;
  revisionReason: string | null;
  equipmentSetId: string;
  calibrationId: string | null;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  readingMethod: "marks" | "strokes";
  entered: unknown;
  measuredMm: number;
  seatingMm: number | null;
  drawInMm?: number | null;
  stressingOrder?: "sequential" | "simultaneous" | null;
  /** The first reading when the elongation was read again finer (absent in pulls before it existed). */
  firstReadingMm?: number | null;
  rereadDeclinedReason?: string | null;
  wireBreaks: number;
  wireBreakDetails?: { strand: number | null; where: "jack_end" | "far_end" | "along_length" | "not_known" }[];
  remarks: string | null;
  deviceTime: string;
  authorUserId: string;
  authorName: string;
}

export interface FieldEvaluation {
  id: string;
  tendonId: string;
  verdict: "in band" | "long" | "short" | "incomplete";
  provisional: boolean;
  deviationPct: number | null;
  createdAt: string;
  /** The records the evaluation judged (absent from servers before the gauge check on the tablet). */
  recordIds?: string[];
}

/** The engineer's decision on a flag, as the crew needs it at the slab edge. */
export interface FieldDisposition {
  /** Absent from servers that predate lift-off checks. */
  id?: string;
  decision: Decision;
  reasons: string;
  engineerName: string;
  createdAt: string;
}

export interface FieldFlag {
  id: string;
  tendonId: string;
  kind: string;
  status: string;
  /** Why the flag was raised, in words (absent on flags pulled before it was synced). */
  reason?: string;
  createdAt?: string;
  /** Oldest first. */
  dispositions?: FieldDisposition[];
}

/** Tails cut on a tendon, as the server stored it. */
export interface FieldTailCut {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  cutAt: string;
  cutByName: string;
  /** Why the tendon was held when the cut reached the server; empty when it was clear. */
  heldReasons: string[];
}

/** What the server found of a lift-off check (SI). */
export interface FieldLiftoffResult {
  liftoffForceN: number;
  expectedForceN: number;
  deviationPct: number;
  bandPct: number;
  withinBand: boolean;
}

/** A lift-off check as the server stored and judged it. */
export interface FieldLiftoffCheck extends FieldLiftoffResult {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  dispositionId: string;
  tendonEnd: "A" | "B";
  equipmentSetId: string;
  pressureMPa: number;
  /** The pressure as typed, e.g. "5950" with unit psi. */
  entered: { pressure: string; unit: "psi" | "MPa" };
  checkedAt: string;
  checkedByName: string;
}

/** A detension as the server stored it, answering the disposition that ordered it. */
export interface FieldDetension {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  dispositionId: string;
  detensionedAt: string;
  operatorName: string;
  equipmentSetId: string;
  /** The gauge pressure at release as typed, null when it was not read. */
  entered: { pressure: string; unit: "psi" | "MPa" } | null;
  releasePressureMPa: number | null;
  strandsDetensioned: number;
  remarks: string | null;
  recordedByName: string;
}

export interface Tombstone {
  table: string;
  id: string;
}

export interface PullResponse {
  cursor: string;
  serverTime: string;
  projects: FieldProject[];
  pours: FieldPour[];
  tendons: FieldTendon[];
  strandLots: FieldStrandLot[];
  equipmentSets: FieldEquipmentSet[];
  calibrations: FieldCalibration[];
  records: FieldRecord[];
  evaluations: FieldEvaluation[];
  flags: FieldFlag[];
  /** Absent from servers that predate tails cut. */
  tailCuts?: FieldTailCut[];
  /** Absent from servers that predate lift-off checks. */
  liftoffChecks?: FieldLiftoffCheck[];
  /** Absent from servers that predate detensions. */
  detensions?: FieldDetension[];
  removed: Tombstone[];
  /** Pours asked for that the caller may no longer take out (removed, or not on their crew). */
  unavailable: string[];
}

/** A pour the crew may take out, for the download list. */
export interface AvailablePour {
  id: string;
  projectId: string;
  projectCode: string;
  projectName: string;
  name: string;
  level: string | null;
  plannedStressingDate: string | null;
  status: string;
  tendonCount: number;
}
