import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { addReview } from "@/lib/server/add-review";
import { correctRecord } from "@/lib/server/correct-record";
import { findFlags } from "@/lib/server/find-flags";
import { recordDisposition } from "@/lib/server/record-disposition";
import { findReleaseBlockers, releasePour } from "@/lib/server/release-pour";
import { copyDemoTendons, demoPerson, demoStressing, flagIdOf, seededDemo, type DemoFixture } from "../support/records";
import { makePour } from "../support/factories";
import { type TestDatabase } from "../support/database";

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
let tendons: { id: string; pour_id: string; tag: string }[];
let people: Record<"inspector" | "engineer", { id: string; name: string }>;
let predicted: (tendonId: string) => Promise<number>;
let stress: Awaited<ReturnType<typeof demoStressing>>["stress"];

beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  // A small pour of our own: two one-end tendons copied from the demo schedule.
  pourId = (await makePour(t.db, fx.projectId, { name: "Review test pour", concreteStrengthMPa: 30 })).id;
  tendons = await copyDemoTendons(t.db, { projectId: fx.projectId, pourId }, ["R-1", "R-2"]);
  people = {
    inspector: await demoPerson(t.db, "inspector@demo.tautline.test"),
    engineer: await demoPerson(t.db, "engineer@demo.tautline.test"),
  };
  ({ predicted, stress } = await demoStressing(t.db, fx));
});
afterAll(async () => {
  await t.drop();
});

/** The inspector's review of the flag. */
const inspectorReview = (flagId: string, review: Parameters<typeof addReview>[1]["review"]) =>
  addReview(t.db, { projectId: fx.projectId, flagId, author: people.inspector, review });

describe("from flag to release", () => {
  it("an out-of-band tendon holds the pour until the engineer's restress comes back in band", async () => {
    const [r1, r2] = tendons as [(typeof tendons)[number], (typeof tendons)[number]];
    await stress(r2, 1.01);
    const { evaluation } = await stress(r1, 0.9);
    expect(evaluation.flagKinds).toEqual(["out_of_band"]);

    const queue = await findFlags(t.db, { projectIds: [fx.projectId], filter: { status: "any_open", pourId } });
    expect(queue.map((q) => q.tag)).toEqual(["R-1"]);
    const flagId = queue[0]!.flags[0]!.id;

    expect(await findReleaseBlockers(t.db, { projectId: fx.projectId, pourId })).toEqual({
      noSchedule: false,
      openFlags: [{ tendonTag: "R-1", kind: "out_of_band" }],
      unstressed: [],
    });
    await expect(
      releasePour(t.db, {
        projectId: fx.projectId,
        pourId,
        by: { ...people.engineer, role: "engineer" },
        statement: "All tendons accepted, tails may be cut.",
        signerName: "Dana Okafor",
        licence: "PE 048213 (invented)",
      }),
    ).rejects.toMatchObject({ code: "CONFLICT", message: expect.stringContaining("1 open flag(s) on R-1") });

    // The inspector may not close an out-of-band flag as paperwork.
    await expect(
      inspectorReview(flagId, { kind: "closed_paperwork", body: "Looks like a typo to me." }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    await inspectorReview(flagId, {
      kind: "remeasured",
      body: "Re-measured the tail mark with a steel tape.",
      remeasuredMm: 150,
    });
    const sent = await inspectorReview(flagId, {
      kind: "sent_to_engineer",
      body: "Short by 10 %; mark confirmed. Please advise.",
    });
    expect(sent.flagStatus).toBe("with_engineer");

    const disposition = await recordDisposition(t.db, {
      projectId: fx.projectId,
      flagId,
      engineer: people.engineer,
      disposition: {
        decision: "restress",
        reasons: "Short elongation; restress to the same gauge pressure and re-read.",
        licenceStatement: "Licensed professional engineer (demo)",
      },
    });
    expect(disposition.flagStatus).toBe("with_engineer");

    // The crew restresses; the new stressing answers the order and comes back in band.
    const restress = await stress(r1, 1.0);
    expect(restress.evaluation).toMatchObject({ verdict: "in band", flagKinds: [] });
    const flag = await t.db
      .selectFrom("flags")
      .select(["status", "close_reason"])
      .where("id", "=", flagId)
      .executeTakeFirstOrThrow();
    expect(flag.status).toBe("closed");
    expect(flag.close_reason).toContain(disposition.dispositionId);

    const release = await releasePour(t.db, {
      projectId: fx.projectId,
      pourId,
      by: { ...people.engineer, role: "engineer" },
      statement: "All tendons stressed and accepted; tails may be cut.",
      signerName: "Dana Okafor",
      licence: "PE 048213 (invented)",
    });
    expect(release.releaseId).toBeTruthy();
    const pour = await t.db
      .selectFrom("pour_states")
      .select("status")
      .where("pour_id", "=", pourId)
      .executeTakeFirstOrThrow();
    expect(pour.status).toBe("released");
  });

  it("refuses a release by a role the project does not name, and a pour with ends never recorded", async () => {
    const pour = await t.db.selectFrom("pours").select("id").where("name", "=", "L2 Pour 2").executeTakeFirstOrThrow();
    await expect(
      releasePour(t.db, {
        projectId: fx.projectId,
        pourId: pour.id,
        by: { ...people.inspector, role: "inspector" },
        statement: "Release by the wrong person.",
        signerName: "Dana Okafor",
        licence: "PE 048213 (invented)",
      }),
    ).rejects.toMatchObject({ code: "FORBIDDEN" });
    const blockers = await findReleaseBlockers(t.db, { projectId: fx.projectId, pourId: pour.id });
    expect(blockers.unstressed).toHaveLength(50);
    expect(blockers.unstressed.find((u) => u.tendonTag === "2-2-B01")?.missingEnds).toEqual(["A", "B"]);
  });

  it("a paperwork correction is a new revision, evaluated again; the original stays untouched", async () => {
    const tendon = await fx.tendon("2-1-U11");
    const { recordId, evaluation } = await stress(tendon, 1.2);
    expect(evaluation.verdict).toBe("long");
    const right = await predicted(tendon.id);
    const corrected = await correctRecord(t.db, {
      projectId: fx.projectId,
      recordId,
      by: people.inspector,
      correction: { reason: "Reading was copied from the tendon next to it.", measuredMm: right },
    });
    expect(corrected.evaluation.verdict).toBe("in band");
    const chain = await t.db
      .selectFrom("records")
      .select(["revision", "measured_mm", "revision_reason"])
      .where("chain_id", "=", recordId)
      .orderBy("revision")
      .execute();
    expect(chain.map((r) => r.revision)).toEqual([1, 2]);
    expect(chain[0]!.measured_mm).toBeCloseTo(right * 1.2, 9);
    expect(chain[1]!.revision_reason).toBe("Reading was copied from the tendon next to it.");
    await expect(
      correctRecord(t.db, {
        projectId: fx.projectId,
        recordId,
        by: people.inspector,
        correction: { reason: "Second try on the old one.", measuredMm: 1 },
      }),
    ).rejects.toMatchObject({
      code: "CONFLICT",
    });
    // With the corrected record in band, the inspector may now close the flag as paperwork.
    const flagId = await flagIdOf(t.db, tendon.id, "out_of_band");
    const closed = await inspectorReview(flagId, {
      kind: "closed_paperwork",
      body: "Transcription error; corrected revision is in band.",
    });
    expect(closed.flagStatus).toBe("closed");
  });

  it("refuses to release a pour with no tendon schedule", async () => {
    const empty = await t.db
      .insertInto("pours")
      .values({ project_id: fx.projectId, name: "Empty pour" })
      .returning("id")
      .executeTakeFirstOrThrow();
    expect((await findReleaseBlockers(t.db, { projectId: fx.projectId, pourId: empty.id })).noSchedule).toBe(true);
    await expect(
      releasePour(t.db, {
        projectId: fx.projectId,
        pourId: empty.id,
        by: { ...people.engineer, role: "engineer" },
        statement: "Nothing here to release at all.",
        signerName: "Dana Okafor",
        licence: "PE 048213 (invented)",
      }),
    ).rejects.toMatchObject({ code: "CONFLICT", message: expect.stringContaining("no tendon schedule") });
  });

  it("keeps dispositions, reviews and releases append-only", async () => {
    for (const table of ["dispositions", "reviews", "releases"]) {
      await expect(sql`update ${sql.id(table)} set created_at = now()`.execute(t.db)).rejects.toThrow(/append-only/);
      await expect(sql`delete from ${sql.id(table)}`.execute(t.db)).rejects.toThrow(/append-only/);
    }
  });
});
