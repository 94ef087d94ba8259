import { expect, test, type APIRequestContext, type APIResponse } from "@playwright/test";
import { readFileSync } from "node:fs";
import path from "node:path";
import {
  BOGUS_TOKEN,
  MISSING_ID,
  acceptInvitationBody,
  calibrationBody,
  certificateUploadBody,
  concreteResultBody,
  dispositionBody,
  equipmentSetBody,
  passwordResetBody,
  passwordResetCompleteBody,
  pourBody,
  recordCorrectionBody,
  releaseBody,
  reopenBody,
  reportSignatureBody,
  reviewBody,
  routesOnDisk,
  scheduleCsv,
  strandLotBody,
  tendonBody,
  walk,
} from "../support/api-routes";
import { MATRIX, SERVER_ACTION_FILES, type Caller } from "./authz-matrix";
import { PEOPLE, apiAs, latestMailTo, lastMailId, linkIn, pourIdByName } from "./people";

test("the matrix lists every route handler and server action on disk, and nothing else", () => {
  expect(Object.keys(MATRIX).sort()).toEqual(routesOnDisk().map((r) => r.endpoint));
  const actionFiles = walk(path.resolve("."))
    .filter((f) => /\.(ts|tsx)$/.test(f))
    .filter((f) => /^\s*["']use server["']/m.test(readFileSync(f, "utf8")))
    .map((f) => path.relative(".", f));
  expect(actionFiles.sort()).toEqual([...SERVER_ACTION_FILES].sort());
});

test.describe("every caller gets the expected answer from every endpoint", () => {
  const contexts = {} as Record<Caller, APIRequestContext>;
  let projectId = "";
  let crewUserId = "";
  let counter = 0;
  const unique = (label: string) => `matrix-${label}-${Date.now()}-${counter++}@demo.tautline.test`;

  test.beforeAll(async () => {
    for (const [caller, email] of Object.entries(PEOPLE) as [Caller, string][]) contexts[caller] = await apiAs(email);
    contexts.anonymous = await apiAs(null);
    const me = (await (await contexts.admin.get("/api/me")).json()) as {
      memberships: { projectId: string; projectCode: string }[];
    };
    projectId = me.memberships.find((m) => m.projectCode === "AYP")!.projectId;
    const list = (await (await contexts.admin.get(`/api/projects/${projectId}/members`)).json()) as {
      members: { userId: string; email: string }[];
    };
    crewUserId = list.members.find((m) => m.email === PEOPLE.crew)!.userId;
  });
  test.afterAll(async () => {
    await Promise.all(Object.values(contexts).map((c) => c.dispose()));
  });

  async function invite(email: string, role = "crew"): Promise<string> {
    const res = await contexts.admin.post(`/api/projects/${projectId}/invitations`, { data: { email, role } });
    expect(res.status()).toBe(201);
    return ((await res.json()) as { invitationId: string }).invitationId;
  }

  /** A person who joined by invitation, so removing them leaves the demo roles intact. */
  async function throwawayMember(): Promise<string> {
    const email = unique("member");
    const before = await lastMailId();
    await invite(email);
    const token = linkIn(await latestMailTo(email, before), "/invite/").split("/invite/")[1]!;
    const accepted = await contexts.anonymous.post("/api/invitations/accept", {
      data: { token, name: "Matrix Throwaway", password: "a-long-enough-password" },
    });
    expect(accepted.status()).toBe(200);
    const list = (await (await contexts.admin.get(`/api/projects/${projectId}/members`)).json()) as {
      members: { userId: string; email: string }[];
    };
    return list.members.find((m) => m.email === email)!.userId;
  }

  /** A pour of the demo project, as the demo crew's download list names it. */
  async function crewDownloadPourId(): Promise<string> {
    const list = (await (await contexts.crew.get("/api/field/pours")).json()) as {
      pours: { id: string; projectId: string }[];
    };
    return list.pours.find((p) => p.projectId === projectId)!.id;
  }

  const CERTIFICATE = Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
  const certificateUpload = certificateUploadBody(CERTIFICATE.byteLength, "matrix.pdf");
  const stamp = () => `${Date.now()}-${counter++}`;
  const matrixPourBody = (name: string) => pourBody(name, "Matrix");
  /** An admin's POST that must answer 201; its JSON's `key`. */
  async function created(url: string, data: unknown, key: string): Promise<string> {
    const res = await contexts.admin.post(url, { data });
    expect(res.status()).toBe(201);
    return ((await res.json()) as Record<string, string>)[key]!;
  }
  /** A throwaway pour, so the demo pours keep their schedules. */
  const throwawayPour = () =>
    created(`/api/projects/${projectId}/pours`, matrixPourBody(`Matrix pour ${stamp()}`), "pourId");
  /** A throwaway strand lot, its number starting with `prefix`. */
  const throwawayLot = (prefix: string) =>
    created(`/api/projects/${projectId}/strand-lots`, strandLotBody(`${prefix}-${stamp()}`), "strandLotId");
  /** A tendon on a throwaway pour, its tag starting with `prefix`. */
  const throwawayTendon = async (prefix: string) =>
    created(
      `/api/projects/${projectId}/pours/${await throwawayPour()}/tendons`,
      tendonBody(`${prefix}-${stamp()}`),
      "tendonId",
    );
  async function demoPourId(): Promise<string> {
    const list = (await (await contexts.admin.get(`/api/projects/${projectId}/pours`)).json()) as {
      pours: { id: string; name: string }[];
    };
    return list.pours.find((p) => p.name === "L2 Pour 1")!.id;
  }
  const SIGNATURE = reportSignatureBody("Matrix", "Matrix check of who may sign the stressing report.");
  const dailySignature = () => ({
    ...SIGNATURE,
    remarks: `Matrix remarks ${stamp()}`,
    conformance: "conforming",
    witness: [],
  });
  /** The project's settings as the admin reads them, without the fields a write does not take. */
  async function settingsToWrite(): Promise<string> {
    const {
      id: _id,
      code: _code,
      ...settings
    } = (await (await contexts.admin.get(`/api/projects/${projectId}/settings`)).json()) as Record<string, unknown>;
    void _id;
    void _code;
    return JSON.stringify(settings);
  }
  /** A calibration route on a set and calibration that do not exist (`then`: the part after the id). */
  const missingCalibration = (then: string) =>
    `/api/projects/${projectId}/equipment-sets/${MISSING_ID}/calibrations/${MISSING_ID}${then}`;

  /** An admin's certificate upload, put in storage; confirmed too when `confirm` is set. */
  async function uploadedCertificate(confirm: boolean): Promise<string> {
    const res = await contexts.admin.post(`/api/projects/${projectId}/uploads`, { data: certificateUpload });
    expect(res.status()).toBe(201);
    const started = (await res.json()) as { attachmentId: string; uploadUrl: string; headers: Record<string, string> };
    expect(
      (await fetch(started.uploadUrl, { method: "PUT", headers: started.headers, body: CERTIFICATE })).status,
    ).toBe(200);
    if (confirm)
      expect(
        (await contexts.admin.post(`/api/projects/${projectId}/uploads/${started.attachmentId}/confirm`)).status(),
      ).toBe(200);
    return started.attachmentId;
  }

  // Each entry makes the call; `fixture` runs once before the callers, who go in the order below
  // so that the allowed (and possibly destructive) call comes last.
  const CALLS: Record<
    string,
    { fixture?: () => Promise<string>; call: (ctx: APIRequestContext, id: string) => Promise<APIResponse> }
  > = {
    "GET /api/health": { call: (c) => c.get("/api/health") },
    "GET /api/auth/[...nextauth]": { call: (c) => c.get("/api/auth/session") },
    "POST /api/auth/[...nextauth]": {
      call: (c) => c.post("/api/auth/_log", { form: { level: "debug", code: "matrix" } }),
    },
    "GET /api/me": { call: (c) => c.get("/api/me") },
    "POST /api/projects": {
      call: (c) =>
        c.post("/api/projects", {
          data: {
            code: `M${String(Date.now()).slice(-6)}`,
            name: "Matrix check project",
            firstAdminEmail: PEOPLE.admin,
          },
        }),
    },
    "GET /api/projects/[projectId]/members": { call: (c) => c.get(`/api/projects/${projectId}/members`) },
    "PATCH /api/projects/[projectId]/members/[userId]": {
      call: (c) => c.patch(`/api/projects/${projectId}/members/${crewUserId}`, { data: { role: "crew" } }),
    },
    "DELETE /api/projects/[projectId]/members/[userId]": {
      fixture: throwawayMember,
      call: (c, userId) => c.delete(`/api/projects/${projectId}/members/${userId}`),
    },
    "POST /api/projects/[projectId]/invitations": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/invitations`, { data: { email: unique("invite"), role: "crew" } }),
    },
    "DELETE /api/projects/[projectId]/invitations/[invitationId]": {
      fixture: () => invite(unique("revoke")),
      call: (c, id) => c.delete(`/api/projects/${projectId}/invitations/${id}`),
    },
    "POST /api/projects/[projectId]/invitations/[invitationId]/resend": {
      fixture: () => invite(unique("resend")),
      call: (c, id) => c.post(`/api/projects/${projectId}/invitations/${id}/resend`),
    },
    "POST /api/projects/[projectId]/uploads": {
      call: (c) => c.post(`/api/projects/${projectId}/uploads`, { data: certificateUpload }),
    },
    "POST /api/projects/[projectId]/uploads/[attachmentId]/confirm": {
      fixture: () => uploadedCertificate(false),
      call: (c, id) => c.post(`/api/projects/${projectId}/uploads/${id}/confirm`),
    },
    "GET /api/projects/[projectId]/attachments/[attachmentId]": {
      fixture: () => uploadedCertificate(true),
      call: (c, id) => c.get(`/api/projects/${projectId}/attachments/${id}`),
    },
    "GET /api/projects/[projectId]/settings": { call: (c) => c.get(`/api/projects/${projectId}/settings`) },
    "PATCH /api/projects/[projectId]/settings": {
      // The admin writes the settings back unchanged.
      fixture: settingsToWrite,
      call: (c, json) => c.patch(`/api/projects/${projectId}/settings`, { data: JSON.parse(json) as unknown }),
    },
    "POST /api/projects/[projectId]/settings/preview": {
      fixture: settingsToWrite,
      call: (c, json) =>
        c.post(`/api/projects/${projectId}/settings/preview`, {
          data: { ...(JSON.parse(json) as Record<string, unknown>), tolerancePct: 5 },
        }),
    },
    "GET /api/projects/[projectId]/pours": { call: (c) => c.get(`/api/projects/${projectId}/pours`) },
    "POST /api/projects/[projectId]/pours": {
      call: (c) => c.post(`/api/projects/${projectId}/pours`, { data: matrixPourBody(`Matrix pour ${stamp()}`) }),
    },
    "PATCH /api/projects/[projectId]/pours/[pourId]": {
      fixture: throwawayPour,
      call: (c, id) =>
        c.patch(`/api/projects/${projectId}/pours/${id}`, { data: matrixPourBody(`Matrix pour renamed ${stamp()}`) }),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/tendons": {
      fixture: demoPourId,
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/tendons`),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/tendons": {
      fixture: throwawayPour,
      call: (c, id) => c.post(`/api/projects/${projectId}/pours/${id}/tendons`, { data: tendonBody(`M-${stamp()}`) }),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/tendons/import": {
      fixture: throwawayPour,
      call: (c, id) =>
        c.post(`/api/projects/${projectId}/pours/${id}/tendons/import`, { data: { csv: scheduleCsv(`M-${stamp()}`) } }),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/tendons/export": {
      fixture: demoPourId,
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/tendons/export`),
    },
    "GET /api/projects/[projectId]/tendon-template": {
      call: (c) => c.get(`/api/projects/${projectId}/tendon-template`),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/report/pdf": {
      fixture: demoPourId,
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/report/pdf`),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/report/csv": {
      fixture: demoPourId,
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/report/csv`),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/report/signatures": {
      fixture: demoPourId,
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/report/signatures`),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/report/signatures": {
      fixture: throwawayPour,
      call: (c, id) => c.post(`/api/projects/${projectId}/pours/${id}/report/signatures`, { data: SIGNATURE }),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/report/signatures/[revision]": {
      fixture: async () => {
        const pourId = await throwawayPour();
        expect(
          (
            await contexts.inspector.post(`/api/projects/${projectId}/pours/${pourId}/report/signatures`, {
              data: SIGNATURE,
            })
          ).status(),
        ).toBe(201);
        return pourId;
      },
      call: (c, id) => c.get(`/api/projects/${projectId}/pours/${id}/report/signatures/1`),
    },
    "GET /api/projects/[projectId]/daily-reports/[day]/pdf": {
      call: (c) => c.get(`/api/projects/${projectId}/daily-reports/2026-12-01/pdf`),
    },
    "GET /api/projects/[projectId]/daily-reports/[day]/csv": {
      call: (c) => c.get(`/api/projects/${projectId}/daily-reports/2026-12-01/csv`),
    },
    "GET /api/projects/[projectId]/daily-reports/[day]/signatures": {
      call: (c) => c.get(`/api/projects/${projectId}/daily-reports/2026-12-01/signatures`),
    },
    // Each inspector call signs new remarks, so it is always a new revision.
    "POST /api/projects/[projectId]/daily-reports/[day]/signatures": {
      call: (c) => c.post(`/api/projects/${projectId}/daily-reports/2001-01-01/signatures`, { data: dailySignature() }),
    },
    "GET /api/projects/[projectId]/daily-reports/[day]/signatures/[revision]": {
      fixture: async () => {
        const res = await contexts.inspector.post(`/api/projects/${projectId}/daily-reports/2001-01-02/signatures`, {
          data: dailySignature(),
        });
        expect(res.status()).toBe(201);
        return String(((await res.json()) as { revision: number }).revision);
      },
      call: (c, revision) => c.get(`/api/projects/${projectId}/daily-reports/2001-01-02/signatures/${revision}`),
    },
    // The engineer's own choice, set to what the demo engineer already has: one e-mail per flag.
    "PATCH /api/projects/[projectId]/flag-mail": {
      call: (c) => c.patch(`/api/projects/${projectId}/flag-mail`, { data: { mode: "each" } }),
    },
    "GET /api/projects/[projectId]/share-links": { call: (c) => c.get(`/api/projects/${projectId}/share-links`) },
    "POST /api/projects/[projectId]/share-links": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/share-links`, { data: { label: "Matrix general contractor", days: 1 } }),
    },
    "DELETE /api/projects/[projectId]/share-links/[linkId]": {
      call: (c) => c.delete(`/api/projects/${projectId}/share-links/${MISSING_ID}`),
    },
    "GET /api/share/[token]/reports/[pourId]/[revision]": {
      call: (c) => c.get(`/api/share/${BOGUS_TOKEN}/reports/${MISSING_ID}/1`),
    },
    "POST /api/report-verifications": {
      call: (c) => c.post("/api/report-verifications", { data: { sha256: "0".repeat(64) } }),
    },
    "GET /api/projects/[projectId]/tendons/[tendonId]": {
      fixture: async () => {
        const list = (await (
          await contexts.admin.get(`/api/projects/${projectId}/pours/${await demoPourId()}/tendons`)
        ).json()) as { tendons: { id: string }[] };
        return list.tendons[0]!.id;
      },
      call: (c, id) => c.get(`/api/projects/${projectId}/tendons/${id}`),
    },
    "GET /api/projects/[projectId]/strand-lots": { call: (c) => c.get(`/api/projects/${projectId}/strand-lots`) },
    "POST /api/projects/[projectId]/strand-lots": {
      call: (c) => c.post(`/api/projects/${projectId}/strand-lots`, { data: strandLotBody(`M-${stamp()}`) }),
    },
    "PATCH /api/projects/[projectId]/strand-lots/[strandLotId]": {
      fixture: () => throwawayLot("M"),
      call: (c, id) =>
        c.patch(`/api/projects/${projectId}/strand-lots/${id}`, {
          data: strandLotBody(`M-${id.slice(0, 8)}`, 196_500),
        }),
    },
    "PATCH /api/projects/[projectId]/tendons/[tendonId]": {
      fixture: () => throwawayTendon("M"),
      call: (c, id) =>
        c.patch(`/api/projects/${projectId}/tendons/${id}`, {
          data: { ...tendonBody(`M-${id.slice(0, 8)}`), segments: [{ lengthMm: 9500, angleRad: 0.1 }] },
        }),
    },
    "POST /api/projects/[projectId]/strand-lots/[strandLotId]/preview": {
      fixture: () => throwawayLot("P"),
      call: (c, id) =>
        c.post(`/api/projects/${projectId}/strand-lots/${id}/preview`, {
          data: strandLotBody(`P-${id.slice(0, 8)}`, 196_500),
        }),
    },
    "POST /api/projects/[projectId]/tendons/[tendonId]/preview": {
      fixture: () => throwawayTendon("P"),
      call: (c, id) =>
        c.post(`/api/projects/${projectId}/tendons/${id}/preview`, {
          data: { ...tendonBody(`P-${id.slice(0, 8)}`), segments: [{ lengthMm: 9500, angleRad: 0.1 }] },
        }),
    },
    "GET /api/projects/[projectId]/equipment-sets": { call: (c) => c.get(`/api/projects/${projectId}/equipment-sets`) },
    "POST /api/projects/[projectId]/equipment-sets": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/equipment-sets`, {
          data: equipmentSetBody(`Matrix set ${stamp()}`, "MJ-1", "MG-1"),
        }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations": {
      fixture: () =>
        created(
          `/api/projects/${projectId}/equipment-sets`,
          equipmentSetBody(`Matrix set ${stamp()}`, "MJ-2", "MG-2"),
          "setId",
        ),
      call: (c, id) =>
        c.post(`/api/projects/${projectId}/equipment-sets/${id}/calibrations`, { data: calibrationBody() }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/preview": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/equipment-sets/${MISSING_ID}/calibrations/preview`, {
          data: calibrationBody(),
        }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement/preview": {
      call: (c) =>
        c.post(missingCalibration("/retirement/preview"), {
          data: { reason: "Matrix check of who may preview a retirement." },
        }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement": {
      call: (c) =>
        c.post(missingCalibration("/retirement"), {
          data: { reason: "Matrix check of who may retire a calibration." },
        }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction": {
      call: (c) =>
        c.post(missingCalibration("/correction"), {
          data: { reason: "Matrix check of who may correct a calibration.", calibration: calibrationBody() },
        }),
    },
    "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction/preview": {
      call: (c) =>
        c.post(missingCalibration("/correction/preview"), {
          data: { reason: "Matrix check of who may preview a correction.", calibration: calibrationBody() },
        }),
    },
    "GET /api/projects/[projectId]/flags": { call: (c) => c.get(`/api/projects/${projectId}/flags?status=any_open`) },
    "POST /api/projects/[projectId]/flags/[flagId]/reviews": {
      call: (c) => c.post(`/api/projects/${projectId}/flags/${MISSING_ID}/reviews`, { data: reviewBody() }),
    },
    "POST /api/projects/[projectId]/flags/[flagId]/dispositions": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/flags/${MISSING_ID}/dispositions`, { data: dispositionBody("Matrix") }),
    },
    "POST /api/projects/[projectId]/records/[recordId]/corrections": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/records/${MISSING_ID}/corrections`, { data: recordCorrectionBody() }),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/release": {
      fixture: () => pourIdByName("L3 Pour 1"),
      call: (c, pourId) =>
        c.post(`/api/projects/${projectId}/pours/${pourId}/release`, {
          data: releaseBody("Matrix"),
        }),
    },
    "GET /api/projects/[projectId]/pours/[pourId]/concrete-results": {
      fixture: () => pourIdByName("L3 Pour 1"),
      call: (c, pourId) => c.get(`/api/projects/${projectId}/pours/${pourId}/concrete-results`),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/concrete-results": {
      call: (c) =>
        c.post(`/api/projects/${projectId}/pours/${MISSING_ID}/concrete-results`, { data: concreteResultBody() }),
    },
    "POST /api/projects/[projectId]/pours/[pourId]/reopen": {
      fixture: () => pourIdByName("L3 Pour 1"),
      call: (c, pourId) => c.post(`/api/projects/${projectId}/pours/${pourId}/reopen`, { data: reopenBody("Matrix") }),
    },
    "POST /api/invitations/accept": {
      call: (c) => c.post("/api/invitations/accept", { data: acceptInvitationBody() }),
    },
    "POST /api/password-reset": {
      call: (c) => c.post("/api/password-reset", { data: passwordResetBody() }),
    },
    "POST /api/password-reset/complete": {
      call: (c) => c.post("/api/password-reset/complete", { data: passwordResetCompleteBody() }),
    },
    "GET /api/field/pours": { call: (c) => c.get("/api/field/pours") },
    "GET /api/field/pours/[pourId]": {
      fixture: crewDownloadPourId,
      call: (c, pourId) => c.get(`/api/field/pours/${pourId}`),
    },
    // An op whose payload is empty: the crew's answer is 200 with the op rejected, so nothing is written.
    "POST /api/sync/push": {
      call: (c) =>
        c.post("/api/sync/push", {
          data: {
            deviceId: "matrix-tablet-01",
            ops: [{ opId: crypto.randomUUID(), kind: "create", recordId: crypto.randomUUID(), payload: {} }],
          },
        }),
    },
    "GET /api/sync/pull": {
      fixture: crewDownloadPourId,
      call: (c, pourId) => c.get(`/api/sync/pull?cursor=0&pours=${pourId}`),
    },
  };

  const ORDER: Caller[] = ["anonymous", "other", "crew", "inspector", "engineer", "admin"];

  test("calls are defined for every matrix entry", () => {
    expect(Object.keys(CALLS).sort()).toEqual(Object.keys(MATRIX).sort());
  });

  for (const [endpoint, expected] of Object.entries(MATRIX)) {
    test(endpoint, async () => {
      const spec = CALLS[endpoint];
      expect(spec, `no call defined for ${endpoint}`).toBeDefined();
      const id = spec!.fixture ? await spec!.fixture() : "";
      const answers: Record<string, number> = {};
      for (const caller of ORDER) answers[caller] = (await spec!.call(contexts[caller], id)).status();
      expect(answers).toEqual(Object.fromEntries(ORDER.map((c) => [c, expected[c]])));
    });
  }
});

test.describe("route handlers refuse cross-site and non-JSON requests", () => {
  test("a foreign Origin is refused before anything happens", async () => {
    const ctx = await apiAs(PEOPLE.admin);
    const me = (await (await ctx.get("/api/me")).json()) as { memberships: { projectId: string }[] };
    const res = await ctx.post(`/api/projects/${me.memberships[0]!.projectId}/invitations`, {
      headers: { Origin: "https://evil.example" },
      data: { email: "someone@demo.tautline.test", role: "crew" },
    });
    expect(res.status()).toBe(403);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("BAD_ORIGIN");
    await ctx.dispose();
  });

  test("a text/plain body is refused with a clear message", async () => {
    const ctx = await apiAs(PEOPLE.admin);
    const me = (await (await ctx.get("/api/me")).json()) as { memberships: { projectId: string }[] };
    const res = await ctx.post(`/api/projects/${me.memberships[0]!.projectId}/invitations`, {
      headers: { "Content-Type": "text/plain" },
      data: JSON.stringify({ email: "someone@demo.tautline.test", role: "crew" }),
    });
    expect(res.status()).toBe(415);
    expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/JSON/);
    await ctx.dispose();
  });

  test("bad input names the field and writes nothing", async () => {
    const ctx = await apiAs(PEOPLE.admin);
    const me = (await (await ctx.get("/api/me")).json()) as { memberships: { projectId: string }[] };
    const projectId = me.memberships[0]!.projectId;
    const before = ((await (await ctx.get(`/api/projects/${projectId}/members`)).json()) as { invitations: unknown[] })
      .invitations.length;
    const res = await ctx.post(`/api/projects/${projectId}/invitations`, {
      data: { email: "not-an-address", role: "foreman" },
    });
    expect(res.status()).toBe(422);
    const body = (await res.json()) as { error: { fields: Record<string, string[]> } };
    expect(Object.keys(body.error.fields).sort()).toEqual(["email", "role"]);
    const after = ((await (await ctx.get(`/api/projects/${projectId}/members`)).json()) as { invitations: unknown[] })
      .invitations.length;
    expect(after).toBe(before);
    await ctx.dispose();
  });
});
