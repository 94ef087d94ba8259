import Dexie from "dexie";
import { IDBFactory, IDBKeyRange } from "fake-indexeddb";
import { describe, expect, it } from "vitest";
import { z } from "zod/mini";
import { fieldPourSchema, fieldProjectSchema, pullAnswer, pullResponseSchema } from "@/lib/schemas/sync-response";
import { FieldDb } from "./db";
import { emptyPull } from "./test-support";

const PROJECT_ID = "0190a0b0-0000-7000-8000-0000000000aa";
const OTHER_PROJECT_ID = "0190a0b0-0000-7000-8000-0000000000ab";
const POUR_ID = "0190a0b0-0000-7000-8000-0000000000bb";
const OPEN_POUR_ID = "0190a0b0-0000-7000-8000-0000000000bc";
const OLD_POUR_ID = "0190a0b0-0000-7000-8000-0000000000bd";

/**
 * The database a tablet holds at version 5, as apps before the one MPa spelling made it: the
 * layout is written out here (not taken from db.ts), since it is what is on the tablets' disks.
 */
function versionFiveDb(name: string, factory: IDBFactory): Dexie {
  const old = new Dexie(name, { indexedDB: factory, IDBKeyRange });
  old.version(1).stores({
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
  old.version(2).stores({ tailCuts: "tendonId, id, pourId" });
  old.version(3).stores({ liftoffChecks: "id, tendonId, pourId", notices: "id, pourId, arrivedAt" });
  old.version(5).stores({ detensions: "id, tendonId, pourId" });
  return old;
}

/** Every table with its key and indexes, as Dexie reads them from the open database. */
const layout = (db: Dexie) =>
  db.tables.map((t) => `${t.name}: ${[t.schema.primKey.src, ...t.schema.indexes.map((i) => i.src)].join(", ")}`).sort();

const oldProject = (id: string, requiredConcreteMpa: number | null) => ({
  id,
  code: "T1",
  name: "Test project",
  unitSystem: "si",
  readingResolution: "1mm",
  tolerancePct: 7,
  shortTendonFloorMm: null,
  comparisonBasis: "net",
  countJackGrip: true,
  frictionMu: 0.07,
  wobblePerM: 0.0014,
  anchorSetMm: 6,
  blindEntry: false,
  requiredConcreteMpa,
});

const oldPour = (id: string, extra: Record<string, unknown>) => ({
  id,
  projectId: PROJECT_ID,
  name: `Pour ${id.slice(-2)}`,
  level: null,
  plannedStressingDate: null,
  status: "stressing",
  release: null,
  reopened: null,
  downloadedAt: "2026-12-02T07:00:00.000Z",
  cursor: "100",
  ...extra,
});

describe("tablet database version 6", () => {
  it("renames the concrete strengths of the project and pour rows a version-5 tablet holds", async () => {
    const factory = new IDBFactory();
    const name = `field-${crypto.randomUUID()}`;
    const old = versionFiveDb(name, factory);
    await old.open();
    expect(old.verno).toBe(5);
    await old.table("projects").bulkPut([oldProject(PROJECT_ID, 28), oldProject(OTHER_PROJECT_ID, null)]);
    await old.table("pours").bulkPut([
      oldPour(POUR_ID, { concreteStrengthMpa: 31.5 }),
      oldPour(OPEN_POUR_ID, { concreteStrengthMpa: null }),
      // Pulled from a server older than the concrete gate: the field was never there.
      oldPour(OLD_POUR_ID, {}),
    ]);
    await old.table("outbox").add({ opId: "op-1", kind: "create", recordId: "r-1", state: "pending" });
    const oldLayout = layout(old);
    old.close();

    const db = new FieldDb(name, { indexedDB: factory, IDBKeyRange });
    await db.open();
    expect(db.verno).toBe(6);

    const projects = new Map((await db.projects.toArray()).map((p) => [p.id, p]));
    expect(projects.get(PROJECT_ID)).toMatchObject({ requiredConcreteMPa: 28, name: "Test project" });
    expect(projects.get(OTHER_PROJECT_ID)).toMatchObject({ requiredConcreteMPa: null });
    for (const p of projects.values()) expect(p).not.toHaveProperty("requiredConcreteMpa");

    const pours = new Map((await db.pours.toArray()).map((p) => [p.id, p]));
    expect(pours.get(POUR_ID)).toMatchObject({ concreteStrengthMPa: 31.5, cursor: "100" });
    expect(pours.get(OPEN_POUR_ID)).toMatchObject({ concreteStrengthMPa: null });
    // Absent stays absent: the tablet still knows it never pulled the gate for that pour.
    expect(pours.get(OLD_POUR_ID)).not.toHaveProperty("concreteStrengthMPa");
    for (const p of pours.values()) expect(p).not.toHaveProperty("concreteStrengthMpa");

    // Nothing else changes: the same tables and indexes, and the rows of other tables kept.
    expect(layout(db)).toEqual(oldLayout);
    expect(await db.outbox.where("opId").equals("op-1").count()).toBe(1);
    expect(await db.pours.where("projectId").equals(PROJECT_ID).count()).toBe(3);
    db.close();
  });

  it("opens a new tablet at version 6 with the layout version 5 had", async () => {
    const factory = new IDBFactory();
    const old = versionFiveDb(`field-${crypto.randomUUID()}`, factory);
    await old.open();
    const fresh = new FieldDb(`field-${crypto.randomUUID()}`, { indexedDB: factory, IDBKeyRange });
    await fresh.open();
    expect(fresh.verno).toBe(6);
    expect(layout(fresh)).toEqual(layout(old));
    old.close();
    fresh.close();
  });

  it("lets an app cached before the rename keep the gate from a new server's answer until version 6 renames it", async () => {
    const sent = pullAnswer(
      emptyPull("200", {
        // Parsing drops the fixture's old name: the server's rows carry the new one only.
        projects: [fieldProjectSchema.parse({ ...oldProject(PROJECT_ID, null), requiredConcreteMPa: 28 })],
        pours: [fieldPourSchema.parse({ ...oldPour(POUR_ID, {}), concreteStrengthMPa: 31.5 })],
      }),
    );
    // The old app's contract: the same fields under the old names; unknown keys are dropped on parse.
    const oldAppPull = z.object({
      projects: z.array(
        z.extend(z.omit(fieldProjectSchema, { requiredConcreteMPa: true }), {
          requiredConcreteMpa: z.optional(z.nullable(z.number())),
        }),
      ),
      pours: z.array(
        z.extend(z.omit(fieldPourSchema, { concreteStrengthMPa: true }), {
          concreteStrengthMpa: z.optional(z.nullable(z.number())),
        }),
      ),
    });
    const read = oldAppPull.parse(JSON.parse(JSON.stringify(sent)));
    expect(read.projects[0]?.requiredConcreteMpa).toBe(28);
    expect(read.pours[0]?.concreteStrengthMpa).toBe(31.5);

    const factory = new IDBFactory();
    const name = `field-${crypto.randomUUID()}`;
    const old = versionFiveDb(name, factory);
    await old.table("projects").bulkPut(read.projects);
    await old
      .table("pours")
      .bulkPut(read.pours.map((p) => ({ ...p, downloadedAt: "2026-12-02T07:00:00.000Z", cursor: "200" })));
    old.close();

    const db = new FieldDb(name, { indexedDB: factory, IDBKeyRange });
    expect((await db.projects.get(PROJECT_ID))?.requiredConcreteMPa).toBe(28);
    expect((await db.pours.get(POUR_ID))?.concreteStrengthMPa).toBe(31.5);
    db.close();

    // The current app reads the new names from the same answer and drops the old ones.
    const current = pullResponseSchema.parse(JSON.parse(JSON.stringify(sent)));
    expect(current.projects[0]).not.toHaveProperty("requiredConcreteMpa");
    expect(current.projects[0]?.requiredConcreteMPa).toBe(28);
  });
});
