/**
 * The app's API as the tests see it, described once: the route handlers on disk, and a valid
 * request body for each kind of call. The authorization matrix (tests/e2e/authz-matrix.spec.ts)
 * and the route fuzz (tests/integration/route-fuzz.test.ts) both build on it; `label` names the
 * test that sent a body ("Matrix", "Fuzz", ...), so its rows can be told apart.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

/** An id no row has. */
export const MISSING_ID = "00000000-0000-4000-8000-000000000000";
/** A token of the right length that was never issued. */
export const BOGUS_TOKEN = "x".repeat(43);
/** The first line of a tendon schedule (CSV). */
export const SCHEDULE_HEADER = "tag,type,strand size [in],strands,ends,segments [ft@deg]";

/** Source files under a folder, skipping dependencies, build output and dot-folders. */
export function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    if (name.startsWith(".") || name === "node_modules" || name === "test-results") return [];
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : [full];
  });
}

export interface RouteOnDisk {
  /** "METHOD /path", as the authorization matrix names it. */
  endpoint: string;
  file: string;
  method: string;
}

/** Every "METHOD /path" that a route.ts under app/ exports, with its file, sorted by endpoint. */
export function routesOnDisk(appDir = path.resolve("app")): RouteOnDisk[] {
  return walk(appDir)
    .filter((f) => /\/route\.tsx?$/.test(f))
    .flatMap((file) => {
      const source = readFileSync(file, "utf8");
      const urlPath =
        "/" +
        path
          .relative(appDir, path.dirname(file))
          .split(path.sep)
          .filter((seg) => !/^\(.*\)$/.test(seg))
          .join("/");
      const methods = new Set<string>();
      for (const m of source.matchAll(/export\s+(?:const|async function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g))
        methods.add(m[1]!);
      for (const m of source.matchAll(/\bas\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) methods.add(m[1]!);
      return [...methods].map((method) => ({ endpoint: `${method} ${urlPath}`, file, method }));
    })
    .sort((a, b) => (a.endpoint < b.endpoint ? -1 : a.endpoint > b.endpoint ? 1 : 0));
}

// ——— Valid request bodies ———

export const pourBody = (name: string, level: string) => ({ name, level, areaM2: null, plannedStressingDate: null });

/** A single-strand tendon of one 9 m segment. */
export const tendonBody = (tag: string) => ({
  tag,
  kind: "unbonded_monostrand",
  strandSize: "0.5 in",
  strandCount: 1,
  segments: [{ lengthMm: 9000, angleRad: 0.1 }],
  ends: "A",
  jackGripMm: null,
  shopElongationMm: null,
  strandLotId: null,
});

/** One schedule row in the CSV import's form, under its header. */
export const scheduleCsv = (tag: string) => `${SCHEDULE_HEADER}\n${tag},monostrand,0.5,1,A,30@2`;

export const strandLotBody = (lotNumber: string, modulusMPa = 197_000) => ({
  lotNumber,
  strandSize: "0.5 in",
  areaMm2: 99,
  modulusMPa,
  breakingLoadN: 186_000,
  certificateAttachmentId: null,
});

export const equipmentSetBody = (name: string, jackSerial: string, gaugeSerial: string) => ({
  name,
  jackSerial,
  gaugeSerial,
  pumpSerial: null,
  jackGripMm: null,
  maxForceN: null,
});

/**
 * A five-point calibration of `calibratedOn` on a straight line of `slope` N per MPa less 900 N
 * (invented figures: 5100 is about a 100 t jack), with no expiry, laboratory or certificate.
 */
export const calibrationBody = (calibratedOn = "2026-12-01", slope = 5100) => ({
  calibratedOn,
  validUntil: null,
  points: [5, 10, 20, 30, 40].map((p) => ({ pressureMPa: p, forceN: slope * p - 900 })),
  laboratory: null,
  certificateAttachmentId: null,
});

export const certificateUploadBody = (sizeBytes: number, originalName: string) => ({
  purpose: "mill_certificate",
  contentType: "application/pdf",
  sizeBytes,
  originalName,
});

/** The inspector's signature of a pour's stressing report. */
export const reportSignatureBody = (label: string, statement = `${label} check of the stressing report.`) => ({
  signerName: `${label} Inspector`,
  licence: `ICC special inspector 0000000 (${label.toLowerCase()})`,
  statement,
});

/** The engineer's release of a pour. */
export const releaseBody = (label: string) => ({
  statement: `${label} check of the release rule.`,
  signerName: `${label} Engineer`,
  licence: `PE 0000000 (${label.toLowerCase()})`,
  confirmed: true,
});

export const reopenBody = (label: string) => ({ reason: `${label} check of the reopen rule.`, confirmed: true });

export const reviewBody = () => ({ kind: "note", body: "Checked the gauge photo." });

export const dispositionBody = (label: string) => ({
  decision: "accept",
  reasons: "Within the engineer's allowance.",
  licenceStatement: `Licensed engineer (${label.toLowerCase()})`,
});

export const recordCorrectionBody = () => ({ reason: "Copied from the wrong line.", measuredMm: 200 });

export const concreteResultBody = () => ({ specimen: "cylinder", strengthMPa: 25, ageDays: 5, specimenCount: 2 });

export const acceptInvitationBody = () => ({ token: BOGUS_TOKEN, name: "Nobody", password: "a-long-enough-password" });
export const passwordResetBody = () => ({ email: "nobody@nowhere.tautline.test" });
export const passwordResetCompleteBody = () => ({ token: BOGUS_TOKEN, password: "a-long-enough-password" });
