import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { can, PERMISSIONS } from "@/lib/auth/permissions";
import { addCalibration } from "@/lib/server/add-calibration";
import { createStrandLot } from "@/lib/server/create-strand-lot";
import { createTendon } from "@/lib/server/create-tendon";
import { getTendonDetail } from "@/lib/server/get-tendon-detail";
import { importTendonSchedule } from "@/lib/server/import-tendon-schedule";
import { listEquipmentSets } from "@/lib/server/list-equipment-sets";
import { listTendons } from "@/lib/server/list-tendons";
import { savePour } from "@/lib/server/save-pour";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";

let t: TestDatabase;
let ayp: string;
let qhm: string;
let adminId: string;
let pourId: string;

const HEADER =
  "tag,type,strand size [in],strands,ends,segments [ft@deg],jack grip [in],shop elongation [in],strand lot";
const count = async (pour: string) =>
  Number(
    (
      await t.db
        .selectFrom("tendons")
        .select((eb) => eb.fn.countAll<number>().as("n"))
        .where("pour_id", "=", pour)
        .executeTakeFirstOrThrow()
    ).n,
  );

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  // Fixed dates below are read against the demo seeded as on 2026-12-01.
  await seedDemo(t.db, { today: new Date("2026-12-01T12:00:00Z") });
  ayp = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  qhm = (await t.db.selectFrom("projects").select("id").where("code", "=", "QHM").executeTakeFirstOrThrow()).id;
  adminId = (await demoPerson(t.db, "admin@demo.tautline.test")).id;
  pourId = (
    await savePour(t.db, {
      projectId: ayp,
      values: { name: "L4 Pour 1", level: "Level 4", areaM2: 1500, plannedStressingDate: "2027-01-12" },
    })
  ).pourId;
});
afterAll(async () => {
  await t.drop();
});

describe("schedule import", () => {
  it("is all or nothing: one bad row among 250 writes no row at all", async () => {
    const rows = Array.from({ length: 250 }, (_, i) => `4-1-U${i},monostrand,0.5,1,A,15@1.62 15@1.62,18,,AY-0871`);
    rows[180] = "4-1-U180,monostrand,0.5,1,A,15@1.62 15@1.62,18,,NO-SUCH-LOT";
    await expect(
      importTendonSchedule(t.db, { projectId: ayp, pourId, csv: [HEADER, ...rows].join("\n"), by: adminId }),
    ).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { "line 182 · strand lot": ['The strand lot "NO-SUCH-LOT" is not registered on this project.'] },
    });
    expect(await count(pourId)).toBe(0);

    rows[180] = "4-1-U180,monostrand,0.5,1,A,15@1.62 15@1.62,18,,AY-0871";
    expect(
      await importTendonSchedule(t.db, { projectId: ayp, pourId, csv: [HEADER, ...rows].join("\n"), by: adminId }),
    ).toEqual({ imported: 250 });
    expect(await count(pourId)).toBe(250);
    // Importing the same file again refuses every tag and adds nothing.
    await expect(
      importTendonSchedule(t.db, { projectId: ayp, pourId, csv: [HEADER, ...rows].join("\n"), by: adminId }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT" });
    expect(await count(pourId)).toBe(250);
  });

  it("cannot reach a pour of another project, neither to write nor to read", async () => {
    await expect(
      importTendonSchedule(t.db, {
        projectId: qhm,
        pourId,
        csv: `${HEADER}\nX1,monostrand,0.5,1,A,10@1,,,`,
        by: adminId,
      }),
    ).rejects.toMatchObject({ code: "NOT_FOUND" });
    await expect(listTendons(t.db, { projectId: qhm, pourId })).rejects.toMatchObject({ code: "NOT_FOUND" });
    const tendonId = (
      await t.db.selectFrom("tendons").select("id").where("pour_id", "=", pourId).executeTakeFirstOrThrow()
    ).id;
    await expect(getTendonDetail(t.db, { projectId: qhm, tendonId })).rejects.toMatchObject({ code: "NOT_FOUND" });
    await expect(
      createTendon(t.db, {
        projectId: qhm,
        pourId,
        values: {
          tag: "X",
          kind: "unbonded_monostrand",
          strandSize: "0.5 in",
          strandCount: 1,
          segments: [{ lengthMm: 1000, angleRad: 0 }],
          ends: "A",
          jackGripMm: null,
          shopElongationMm: null,
          strandLotId: null,
        },
      }),
    ).rejects.toMatchObject({ code: "NOT_FOUND" });
  });
});

describe("who may change the schedule", () => {
  it("only the admin role manages schedule, lots and equipment; crew, inspector and engineer only view", () => {
    for (const action of ["schedule.manage", "equipment.manage", "project.configure"] as const) {
      expect(PERMISSIONS[action]).toEqual(["admin"]);
      expect(can("crew", action)).toBe(false);
    }
    expect(can("crew", "schedule.view")).toBe(true);
  });
});

describe("strand lots, calibrations and the tendon detail", () => {
  it("computes a lot's tendons with its values and gives a target pressure per calibrated set", async () => {
    const { strandLotId } = await createStrandLot(t.db, {
      projectId: ayp,
      values: {
        lotNumber: "AY-1200",
        strandSize: "0.5 in",
        areaMm2: 100.1,
        modulusMPa: 198_000,
        breakingLoadN: 188_000,
        certificateAttachmentId: null,
      },
    });
    await expect(
      createStrandLot(t.db, {
        projectId: ayp,
        values: {
          lotNumber: "AY-1200",
          strandSize: "0.5 in",
          areaMm2: 99,
          modulusMPa: 197_000,
          breakingLoadN: 187_000,
          certificateAttachmentId: null,
        },
      }),
    ).rejects.toMatchObject({ code: "CONFLICT", fields: { lotNumber: expect.any(Array) } });
    const { tendonId } = await createTendon(t.db, {
      projectId: ayp,
      pourId,
      values: {
        tag: "4-1-X1",
        kind: "unbonded_monostrand",
        strandSize: "0.5 in",
        strandCount: 1,
        segments: [{ lengthMm: 9144, angleRad: 0.05 }],
        ends: "A",
        jackGripMm: 457.2,
        shopElongationMm: 80,
        strandLotId,
      },
    });
    const sets = await listEquipmentSets(t.db, ayp, "2026-12-20");
    const setB = sets.find((s) => s.name.startsWith("Set B"))!;
    expect(setB.state).toBe("expired"); // demo set B runs out on 2026-12-09

    const { validUntil } = await addCalibration(t.db, {
      projectId: ayp,
      setId: setB.id,
      today: "2026-12-20",
      values: {
        calibratedOn: "2026-12-15",
        validUntil: "2028-01-01",
        points: [0, 10, 20, 30, 40].map((p) => ({ pressureMPa: p, forceN: 5000 * p })),
        laboratory: null,
        certificateAttachmentId: null,
      },
    });
    // The project allows 182 days: the earlier of that and the certificate's own date wins.
    expect(validUntil).toBe("2027-06-15");

    const detail = await getTendonDetail(t.db, { projectId: ayp, tendonId, today: "2026-12-20" });
    expect(detail.computed.ok).toBe(true);
    if (!detail.computed.ok) return;
    expect(detail.computed.prediction.strand).toMatchObject({
      source: "strand lot",
      areaMm2: 100.1,
      modulusMPa: 198_000,
    });
    expect(detail.computed.nominalPredictedMm).not.toBeCloseTo(detail.computed.prediction.predictedMm, 3);
    const target = detail.targets.find((x) => x.setId === setB.id)!;
    // Line force = 5000 N/MPa · p: the target is the jacking force over 5000.
    expect(target.targetPressureMPa).toBeCloseTo(detail.computed.prediction.jackingForceN / 5000, 9);
    expect(target.state).toBe("valid");
    expect(detail.computed.shopDifferencePct).toBeCloseTo(
      ((80 - detail.computed.prediction.predictedMm) / detail.computed.prediction.predictedMm) * 100,
      9,
    );
  });

  it("two admins adding the same tag at once: one tendon, and the other is told the tag is taken", async () => {
    const values = {
      tag: "4-1-RACE",
      kind: "unbonded_monostrand" as const,
      strandSize: "0.5 in",
      strandCount: 1,
      segments: [{ lengthMm: 9144, angleRad: 0.05 }],
      ends: "A" as const,
      jackGripMm: null,
      shopElongationMm: null,
      strandLotId: null,
    };
    const outcomes = await Promise.allSettled(
      Array.from({ length: 4 }, () => createTendon(t.db, { projectId: ayp, pourId, values })),
    );
    expect(outcomes.filter((o) => o.status === "fulfilled")).toHaveLength(1);
    for (const o of outcomes.filter((x) => x.status === "rejected"))
      expect(o.reason).toMatchObject({ code: "CONFLICT", fields: { tag: expect.any(Array) } });
    expect(
      await t.db
        .selectFrom("tendons")
        .select("id")
        .where("pour_id", "=", pourId)
        .where("tag", "=", "4-1-RACE")
        .execute(),
    ).toHaveLength(1);
  });

  it("the demo seed gives shop-drawing elongations, two per pour more than 2 % from ours", async () => {
    const withShop = await t.db
      .selectFrom("tendons")
      .select(["id", "tag"])
      .where("project_id", "=", ayp)
      .where("shop_elongation_mm", "is not", null)
      .where("pour_id", "!=", pourId)
      .execute();
    expect(withShop).toHaveLength(18);
    const marked = [];
    for (const row of withShop) {
      const detail = await getTendonDetail(t.db, { projectId: ayp, tendonId: row.id });
      if (detail.computed.ok && detail.computed.shopMarked) marked.push(row.tag);
    }
    expect(marked.sort()).toEqual(["2-1-U18", "2-1-U30", "2-2-U18", "2-2-U30", "3-1-U18", "3-1-U30"]);
  });

  it("refuses calibration points that make no line, naming the field", async () => {
    const setA = (await listEquipmentSets(t.db, ayp)).find((s) => s.name.startsWith("Set A"))!;
    await expect(
      addCalibration(t.db, {
        projectId: ayp,
        setId: setA.id,
        today: "2026-12-20",
        values: {
          calibratedOn: "2026-12-15",
          validUntil: null,
          points: [
            { pressureMPa: 10, forceN: 9000 },
            { pressureMPa: 20, forceN: 1000 },
          ],
          laboratory: null,
          certificateAttachmentId: null,
        },
      }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT", fields: { points: expect.any(Array) } });
  });
});
