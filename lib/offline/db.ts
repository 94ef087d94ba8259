import Dexie, { type DexieOptions, type Table } from "dexie";
import type { TendonEnd, Verdict } from "@/lib/schemas/domain";
import type { RecordPayload } from "@/lib/schemas/record";
import type { DetensionPayload } from "@/lib/schemas/detension";
import type { LiftoffPayload } from "@/lib/schemas/liftoff";
import type { TailCutPayload } from "@/lib/schemas/tail-cut";
import type { DecisionNotice } from "./decision-notices";
import type {
  FieldCalibration,
  FieldEquipmentSet,
  FieldEvaluation,
  FieldFlag,
  FieldPour,
  FieldProject,
  FieldStrandLot,
  FieldDetension,
  FieldLiftoffCheck,
  FieldLiftoffResult,
  FieldTailCut,
  FieldTendon,
  OpError,
  OpEvaluation,
  OpKind,
} from "@/lib/schemas/sync";

/**
 * The tablet's own database (IndexedDB through Dexie): the reference data of the pours taken
 * out, the records made here and those the server sent, the outbox of operations waiting to be
 * pushed, and the photos waiting to upload. Client-only. Keys are UUIDs made on the tablet or
 * by the server; the outbox's auto-increment seq only orders this tablet's own operations.
 */

/** What the server said of an op it did not take: it lost to another revision, or it was refused. */
export type RefusedState = "conflict" | "rejected";

/** Where a row made on this tablet stands with the server. */
export type RecordSyncState = "pending" | "synced" | RefusedState;

/** An outbox entry waits for a push, or was refused by the server and waits for a person. */
export type OutboxState = "pending" | "attention";

/** Where a photo stands on its way to the server. */
export type PhotoState = "queued" | "uploading" | "stored" | "failed";

/** The keys of the meta table. */
export type MetaKey = "device" | "session" | "sync";

/** The tablet's provisional verdict, worked out from lib/stressing at the moment of saving. */
export interface LocalVerdict {
  verdict: Verdict;
  /** Null when the verdict is incomplete. */
  deviationPct: number | null;
  measuredMm: number | null;
  predictedMm: number | null;
  lowerMm: number | null;
  upperMm: number | null;
  provisional: boolean;
  missingEnds: TendonEnd[];
  /** Which prediction each end was compared with, in words. */
  basisLabel?: string;
  /** Why the verdict is incomplete. */
  incomplete?: string[];
  /** The flags the server's rules will raise on these readings, as the tablet sees them. */
  flagKinds?: string[];
  /** Gauge force and the force the elongation implies, per end read. */
  forces?: {
    end: TendonEnd;
    gaugeForceN: number | null;
    impliedForceN: number | null;
    role: string;
    /** (implied − gauge)/gauge, %, and the band it is judged in (the force-agreement rule's). */
    differencePct?: number | null;
    bandPct?: number | null;
  }[];
  specifiedForceN?: number;
  /** Where it came from in words: "from the schedule" or the project's factor ("0.80·fpu·A"). */
  specifiedForceFrom?: string;
  /** The reading division alone could flip the verdict: read again, finer, before it is final. */
  reread?: boolean;
  /** Which prediction governed, and the shop drawing's value beside Tautline's, in words. */
  governsLine?: string;
}

export interface LocalRecord extends RecordPayload {
  id: string;
  syncState: RecordSyncState;
  authorName: string;
  savedAt: string;
  local?: LocalVerdict | null;
  server?: OpEvaluation | null;
  /** Set on a revision's base once a newer revision exists here. */
  supersededBy?: string | null;
}

export interface OutboxEntry {
  seq?: number;
  opId: string;
  kind: OpKind;
  recordId: string;
  baseVersion?: number;
  /**
   * A record for create and revise; a tails cut for tails_cut (its recordId is the cut's id); a
   * lift-off check for liftoff_check (its recordId is the check's id); a detension for detension
   * (its recordId is the detension's id).
   */
  payload: RecordPayload | TailCutPayload | LiftoffPayload | DetensionPayload;
  authorUserId: string;
  /** "pending" waits for a push; "attention" was refused by the server and waits for a person. */
  state: OutboxState;
  createdAt: string;
  attempts: number;
  lastError?: string | null;
  status?: RefusedState;
  error?: OpError;
}

/** Tails cut on a tendon, made here or pulled; keyed by tendon, so the server's cut replaces a local one. */
export interface LocalTailCut extends FieldTailCut {
  syncState: RecordSyncState;
}

/** A lift-off check made here or pulled; the server's result arrives with its answer or the pull. */
export interface LocalLiftoffCheck
  extends Omit<FieldLiftoffCheck, keyof FieldLiftoffResult | "pressureMPa">, Partial<FieldLiftoffResult> {
  pressureMPa: number;
  syncState: RecordSyncState;
}

/** A detension recorded here or pulled. */
export interface LocalDetension extends FieldDetension {
  syncState: RecordSyncState;
}

/** A change a sync brought (lib/offline/decision-notices.ts), kept until the crew acknowledges it. */
export interface LocalNotice extends DecisionNotice {
  /** When the pull that brought it was taken in. */
  arrivedAt: string;
  acknowledgedAt: string | null;
  /** Who acknowledged it on this tablet. */
  acknowledgedBy: string | null;
}

export interface LocalPour extends FieldPour {
  downloadedAt: string;
  /** The server's cursor this pour was last pulled at. */
  cursor: string;
  /** Set when the server says the pour can no longer be taken out. */
  unavailable?: boolean;
}

export interface LocalPhoto {
  id: string;
  recordId: string;
  projectId: string;
  blob: Blob;
  contentType: string;
  sizeBytes: number;
  width: number;
  height: number;
  takenAt: string;
  state: PhotoState;
  uploadedBytes: number;
  attachmentId?: string | null;
  lastError?: string | null;
}

export interface SessionMeta {
  userId: string;
  name: string;
  email: string;
  /** Projects on which this person records, with the display name. */
  projects: { projectId: string; projectName: string; projectCode: string }[];
  checkedAt: string;
}

export interface SyncMeta {
  lastConfirmedSyncAt: string | null;
  lastAttemptAt: string | null;
  lastError: string | null;
  needsSignIn: boolean;
  storagePersisted: boolean | null;
}

export interface MetaRow {
  key: MetaKey;
  value: unknown;
}

export class FieldDb extends Dexie {
  meta!: Table<MetaRow, string>;
  projects!: Table<FieldProject, string>;
  pours!: Table<LocalPour, string>;
  tendons!: Table<FieldTendon, string>;
  strandLots!: Table<FieldStrandLot, string>;
  equipmentSets!: Table<FieldEquipmentSet, string>;
  calibrations!: Table<FieldCalibration, string>;
  records!: Table<LocalRecord, string>;
  evaluations!: Table<FieldEvaluation, string>;
  flags!: Table<FieldFlag, string>;
  outbox!: Table<OutboxEntry, number>;
  photos!: Table<LocalPhoto, string>;
  tailCuts!: Table<LocalTailCut, string>;
  liftoffChecks!: Table<LocalLiftoffCheck, string>;
  detensions!: Table<LocalDetension, string>;
  notices!: Table<LocalNotice, string>;

  constructor(name = "tautline-field", options?: DexieOptions) {
    super(name, options);
    this.version(1).stores({
      meta: "key",
      projects: "id",
      pours: "id, projectId",
      tendons: "id, pourId, [pourId+tag]",
      strandLots: "id, projectId",
      equipmentSets: "id, projectId",
      calibrations: "id, equipmentSetId, projectId",
      records: "id, tendonId, chainId, pourId, syncState",
      evaluations: "id, tendonId",
      flags: "id, tendonId",
      outbox: "++seq, &opId, recordId, state, authorUserId",
      photos: "id, recordId, state",
    });
    this.version(2).stores({ tailCuts: "tendonId, id, pourId" });
    // Version 3 adds the lift-off checks and the notices a sync brings; every table of version 2 is kept.
    this.version(3).stores({ liftoffChecks: "id, tendonId, pourId", notices: "id, pourId, arrivedAt" });
    // Version 5 adds the detensions; every table of version 3 is kept.
    this.version(5).stores({ detensions: "id, tendonId, pourId" });
    // Version 6 keeps every table and renames two fields on the rows already stored: the project's
    // `requiredConcreteMpa` and the pour's `concreteStrengthMpa`, pulled by apps before the one MPa
    // spelling, become `requiredConcreteMPa` and `concreteStrengthMPa`. The pull sends a project or a
    // pour again only when it changes, so without this a tablet would keep the old name (and lose the
    // concrete gate) until then.
    this.version(6)
      .stores({})
      .upgrade(async (tx) => {
        await tx.table("projects").toCollection().modify(renameField("requiredConcreteMpa", "requiredConcreteMPa"));
        await tx.table("pours").toCollection().modify(renameField("concreteStrengthMpa", "concreteStrengthMPa"));
      });
  }
}

/** A row change that moves a field to its new name; a value already under the new name is kept. */
function renameField(from: string, to: string) {
  return (row: Record<string, unknown>) => {
    if (!(from in row)) return;
    if (!(to in row)) row[to] = row[from];
    delete row[from];
  };
}

let shared: FieldDb | undefined;

/** The page's one database connection. */
export function fieldDb(): FieldDb {
  shared ??= new FieldDb();
  return shared;
}

export async function readMeta<T>(db: FieldDb, key: MetaRow["key"]): Promise<T | undefined> {
  return (await db.meta.get(key))?.value as T | undefined;
}

export async function writeMeta(db: FieldDb, key: MetaRow["key"], value: unknown): Promise<void> {
  await db.meta.put({ key, value });
}

export const EMPTY_SYNC_META: SyncMeta = {
  lastConfirmedSyncAt: null,
  lastAttemptAt: null,
  lastError: null,
  needsSignIn: false,
  storagePersisted: null,
};

export async function updateSyncMeta(db: FieldDb, change: Partial<SyncMeta>): Promise<SyncMeta> {
  return db.transaction("rw", db.meta, async () => {
    const next = { ...EMPTY_SYNC_META, ...(await readMeta<SyncMeta>(db, "sync")), ...change };
    await writeMeta(db, "sync", next);
    return next;
  });
}

/** This tablet's id, made once and kept: the server records it with every operation. */
export async function deviceId(db: FieldDb): Promise<string> {
  return db.transaction("rw", db.meta, async () => {
    const existing = await readMeta<string>(db, "device");
    if (existing) return existing;
    const made = `tablet-${crypto.randomUUID()}`;
    await writeMeta(db, "device", made);
    return made;
  });
}
