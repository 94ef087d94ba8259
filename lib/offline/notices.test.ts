import "fake-indexeddb/auto";
import Dexie from "dexie";
import { IDBKeyRange } from "fake-indexeddb";
import { describe, expect, it } from "vitest";
import type { FieldFlag, FieldPour, FieldProject, FieldTendon, PullResponse } from "@/lib/schemas/sync";
import { FieldDb } from "./db";
import { acknowledgeNotices, openNotices } from "./notices";
import { applyPull } from "./reference";
import { emptyPull, testDb } from "./test-support";

const PROJECT = { id: "pr1", code: "T1", name: "Test project" } as FieldProject;
const POUR: FieldPour = {
  id: "p1",
  projectId: "pr1",
  name: "Level 3 east",
  level: "3",
  plannedStressingDate: null,
  status: "stressing",
  release: null,
  reopened: null,
};
const TENDON = { id: "t1", projectId: "pr1", pourId: "p1", tag: "U07", ends: "A" } as FieldTendon;
const FLAG: FieldFlag = {
  id: "f1",
  tendonId: "t1",
  kind: "out_of_band",
  status: "open",
  reason: "Measured 14.4 % long against the prediction.",
  createdAt: "2026-12-02T15:00:00.000Z",
  dispositions: [],
};

let cursor = 100;
function pull(over: Partial<PullResponse>): PullResponse {
  cursor++;
  return emptyPull(String(cursor), {
    serverTime: `2026-12-02T16:${String(cursor % 60).padStart(2, "0")}:00.000Z`,
    ...over,
  });
}

const download = (db: FieldDb, over: Partial<PullResponse> = {}) =>
  applyPull(db, pull({ projects: [PROJECT], pours: [POUR], tendons: [TENDON], ...over }), {
    pourIds: ["p1"],
    downloadedAt: "2026-12-02T15:30:00.000Z",
  });

const restressed: FieldFlag = {
  ...FLAG,
  status: "with_engineer",
  dispositions: [
    {
      decision: "restress",
      reasons: "Restress to 3,350 psi and re-read the marks.",
      engineerName: "P. Raman",
      createdAt: "2026-12-02T16:00:00.000Z",
    },
  ],
};

describe("notices kept by applyPull", () => {
  it("keeps nothing for a first download, then a notice for the engineer's decision on the next pull", async () => {
    const { db } = testDb();
    await download(db, { flags: [FLAG] });
    expect(await openNotices(db)).toEqual([]);

    await applyPull(db, pull({ flags: [restressed] }), { pourIds: ["p1"] });
    const [notice, ...rest] = await openNotices(db, "p1");
    expect(rest).toEqual([]);
    expect(notice).toMatchObject({
      kind: "decision",
      tendonTag: "U07",
      words: "Restress to 3,350 psi and re-read the marks.",
      acknowledgedAt: null,
    });
    expect(await openNotices(db, "another pour")).toEqual([]);
  });

  it("does not repeat a notice when the server sends the same rows again", async () => {
    const { db } = testDb();
    await download(db, { flags: [FLAG] });
    await applyPull(db, pull({ flags: [restressed] }), { pourIds: ["p1"] });
    await applyPull(db, pull({ flags: [restressed] }), { pourIds: ["p1"] });
    expect(await db.notices.count()).toBe(1);
  });

  it("keeps a notice until it is acknowledged, also across a reopening of the database (a reload)", async () => {
    const { db, factory, name } = testDb();
    await download(db);
    await applyPull(db, pull({ flags: [FLAG] }), { pourIds: ["p1"] });
    db.close();

    const reopened = new FieldDb(name, { indexedDB: factory, IDBKeyRange });
    const [notice] = await openNotices(reopened);
    expect(notice).toMatchObject({ kind: "flag", tendonTag: "U07" });
    expect(await acknowledgeNotices(reopened, [notice!.id], "Test Crew", "2026-12-02T17:00:00.000Z")).toBe(1);
    expect(await openNotices(reopened)).toEqual([]);
    expect(await reopened.notices.get(notice!.id)).toMatchObject({
      acknowledgedAt: "2026-12-02T17:00:00.000Z",
      acknowledgedBy: "Test Crew",
    });
    // A second acknowledgement changes nothing; the same change arriving again is not shown again.
    expect(await acknowledgeNotices(reopened, [notice!.id], "Someone else")).toBe(0);
    await applyPull(reopened, pull({ flags: [FLAG] }), { pourIds: ["p1"] });
    expect(await openNotices(reopened)).toEqual([]);
  });

  it("tells of a release", async () => {
    const { db } = testDb();
    await download(db);
    const release = { by: "P. Raman", at: "2026-12-02T18:00:00.000Z", statement: "Released for tail cutting." };
    await applyPull(db, pull({ pours: [{ ...POUR, status: "released", release }] }), { pourIds: ["p1"] });
    expect(await openNotices(db)).toMatchObject([{ kind: "released", words: "Released for tail cutting." }]);
  });
});

describe("tablet database version 3 and later", () => {
  it("opens a version 2 database and keeps its data, adding the notices and detensions tables", async () => {
    const { factory, name } = testDb();
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
    await old.table("pours").put({ ...POUR, downloadedAt: "x", cursor: "5" });
    await old.table("flags").put(FLAG);
    await old.table("outbox").add({ opId: "op1", recordId: "r1", state: "pending", authorUserId: "u1" });
    await old.table("tailCuts").put({ tendonId: "t1", id: "c1", pourId: "p1" });
    old.close();

    const db = new FieldDb(name, { indexedDB: factory, IDBKeyRange });
    await db.open();
    // Version 5 (detensions) keeps every table of version 3; version 6 only renames fields of stored rows.
    expect(db.verno).toBe(6);
    expect(await db.pours.get("p1")).toMatchObject({ name: "Level 3 east", cursor: "5" });
    expect(await db.flags.get("f1")).toEqual(FLAG);
    expect(await db.outbox.where("opId").equals("op1").count()).toBe(1);
    expect(await db.tailCuts.get("t1")).toMatchObject({ id: "c1" });
    expect(await db.notices.count()).toBe(0);
    expect(await db.detensions.count()).toBe(0);
  });
});
