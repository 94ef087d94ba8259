import { IDBFactory, IDBKeyRange } from "fake-indexeddb";
import { uuidv7 } from "uuidv7";
import type { RecordPayload } from "@/lib/schemas/record";
import type { FieldTendon, PullResponse } from "@/lib/schemas/sync";
import { emptyPull as emptyPullAt } from "@/lib/schemas/sync-response";
import { FieldDb, writeMeta, type SessionMeta } from "./db";

/** A tablet database on fake-indexeddb for tests; `factory` lets a test reopen the same data. */
export function testDb(
  name = `field-${crypto.randomUUID()}`,
  factory: IDBFactory = new IDBFactory(),
): { db: FieldDb; factory: IDBFactory; name: string } {
  return { db: new FieldDb(name, { indexedDB: factory, IDBKeyRange }), factory, name };
}

export const TEST_USER: SessionMeta = {
  userId: "0190a0b0-0000-7000-8000-000000000001",
  name: "Test Crew",
  email: "crew@test.tautline.test",
  projects: [],
  checkedAt: "2026-12-02T08:00:00.000Z",
};

export async function signIn(db: FieldDb, user: SessionMeta = TEST_USER): Promise<void> {
  await writeMeta(db, "session", user);
}

/** A first revision as the form would make it (values need not match a real tendon here). */
export function samplePayload(overrides: Partial<RecordPayload> = {}): { recordId: string; payload: RecordPayload } {
  const recordId = uuidv7();
  return {
    recordId,
    payload: {
      projectId: "0190a0b0-0000-7000-8000-0000000000aa",
      pourId: "0190a0b0-0000-7000-8000-0000000000bb",
      tendonId: "0190a0b0-0000-7000-8000-0000000000cc",
      tendonEnd: "A",
      chainId: recordId,
      revision: 1,
      baseRecordId: null,
      revisionReason: null,
      equipmentSetId: "0190a0b0-0000-7000-8000-0000000000dd",
      calibrationId: null,
      expiredCalibrationReason: null,
      initialPressureMPa: null,
      finalPressureMPa: 28.5,
      readingMethod: "marks",
      entered: {
        units: { length: "mm", pressure: "MPa" },
        initialPressure: null,
        finalPressure: "28.5",
        marks: { before: "0", after: "112" },
        strokes: null,
        seating: null,
      },
      measuredMm: 112,
      seatingMm: null,
      wireBreaks: 0,
      remarks: null,
      deviceTime: "2026-12-02T09:00:00.000Z",
      deviceTimeZone: "UTC",
      authorUserId: TEST_USER.userId,
      ...overrides,
    },
  };
}

/** A pull that changes nothing, at a cursor: a test names what it brings. */
export function emptyPull(cursor: string, over: Partial<PullResponse> = {}): PullResponse {
  return { ...emptyPullAt(cursor, "2026-12-02T16:00:00.000Z"), ...over };
}

/** A one-end, single-strand 9 m tendon of the pour on the tablet (values need not match a real tendon). */
export function fieldTendon(where: { id: string; projectId: string; pourId: string; tag: string }): FieldTendon {
  return {
    ...where,
    kind: "unbonded_monostrand",
    strandSize: "0.5 in",
    strandCount: 1,
    segments: [{ lengthMm: 9000, angleRad: 0 }],
    ends: "A",
    jackGripMm: null,
    strandLotId: null,
  };
}
