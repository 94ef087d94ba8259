/**
 * The authorization matrix: every route handler (and server action) of the app, with the
 * answer each caller must get. tests/e2e/authz-matrix.spec.ts lists the route files on disk and
 * fails when one is missing here, then calls each against the running app.
 *
 * Callers: the four roles on the demo project, a crew member of another project, anonymous.
 */
import type { Person } from "./people";

export type Caller = Person | "anonymous";
export type Expected = Record<Caller, number>;

const everyone = (status: number): Expected => ({
  admin: status,
  crew: status,
  inspector: status,
  engineer: status,
  other: status,
  anonymous: status,
});
const signedIn = (status: number): Expected => ({ ...everyone(status), anonymous: 401 });
/** A project-scoped action: allowed roles get `ok`, other roles 403, the stranger 404, anonymous 401. */
const projectAction = (ok: number, allowed: Person[]): Expected => ({
  admin: allowed.includes("admin") ? ok : 403,
  crew: allowed.includes("crew") ? ok : 403,
  inspector: allowed.includes("inspector") ? ok : 403,
  engineer: allowed.includes("engineer") ? ok : 403,
  other: 404,
  anonymous: 401,
});

/** Every role on the project. */
const MEMBERS: Person[] = ["admin", "crew", "inspector", "engineer"];
/** The roles that read and sign reports: all but the crew. */
const READERS: Person[] = ["admin", "inspector", "engineer"];

export const MATRIX: Record<string, Expected> = {
  "GET /api/health": everyone(200),
  "GET /api/auth/[...nextauth]": everyone(200),
  "POST /api/auth/[...nextauth]": everyone(200),
  "GET /api/me": signedIn(200),
  "POST /api/projects": { ...signedIn(403), admin: 201 },
  "GET /api/projects/[projectId]/members": projectAction(200, ["admin"]),
  "PATCH /api/projects/[projectId]/members/[userId]": projectAction(200, ["admin"]),
  "DELETE /api/projects/[projectId]/members/[userId]": projectAction(200, ["admin"]),
  "POST /api/projects/[projectId]/invitations": projectAction(201, ["admin"]),
  "DELETE /api/projects/[projectId]/invitations/[invitationId]": projectAction(200, ["admin"]),
  "POST /api/projects/[projectId]/invitations/[invitationId]/resend": projectAction(200, ["admin"]),
  "POST /api/projects/[projectId]/uploads": projectAction(201, ["admin"]),
  "POST /api/projects/[projectId]/uploads/[attachmentId]/confirm": projectAction(200, ["admin"]),
  "GET /api/projects/[projectId]/attachments/[attachmentId]": projectAction(200, MEMBERS),
  "GET /api/projects/[projectId]/settings": projectAction(200, MEMBERS),
  "PATCH /api/projects/[projectId]/settings": projectAction(200, ["admin"]),
  "PATCH /api/projects/[projectId]/flag-mail": projectAction(200, ["engineer"]),
  "POST /api/projects/[projectId]/settings/preview": projectAction(200, ["admin"]),
  "GET /api/projects/[projectId]/pours": projectAction(200, MEMBERS),
  "POST /api/projects/[projectId]/pours": projectAction(201, ["admin"]),
  "PATCH /api/projects/[projectId]/pours/[pourId]": projectAction(200, ["admin"]),
  "GET /api/projects/[projectId]/pours/[pourId]/tendons": projectAction(200, MEMBERS),
  "POST /api/projects/[projectId]/pours/[pourId]/tendons": projectAction(201, ["admin"]),
  "POST /api/projects/[projectId]/pours/[pourId]/tendons/import": projectAction(201, ["admin"]),
  "GET /api/projects/[projectId]/pours/[pourId]/tendons/export": projectAction(200, MEMBERS),
  "GET /api/projects/[projectId]/tendon-template": projectAction(200, MEMBERS),
  "GET /api/projects/[projectId]/pours/[pourId]/report/pdf": projectAction(200, READERS),
  "GET /api/projects/[projectId]/pours/[pourId]/report/csv": projectAction(200, READERS),
  "GET /api/projects/[projectId]/pours/[pourId]/report/signatures": projectAction(200, READERS),
  "POST /api/projects/[projectId]/pours/[pourId]/report/signatures": projectAction(201, ["inspector"]),
  "GET /api/projects/[projectId]/pours/[pourId]/report/signatures/[revision]": projectAction(200, READERS),
  // The day's special-inspection report: the inspector signs; the engineer and the admin read; crew may not.
  "GET /api/projects/[projectId]/daily-reports/[day]/pdf": projectAction(200, READERS),
  "GET /api/projects/[projectId]/daily-reports/[day]/csv": projectAction(200, READERS),
  "GET /api/projects/[projectId]/daily-reports/[day]/signatures": projectAction(200, READERS),
  "POST /api/projects/[projectId]/daily-reports/[day]/signatures": projectAction(201, ["inspector"]),
  "GET /api/projects/[projectId]/daily-reports/[day]/signatures/[revision]": projectAction(200, READERS),
  "GET /api/projects/[projectId]/share-links": projectAction(200, READERS),
  "POST /api/projects/[projectId]/share-links": projectAction(201, READERS),
  // Revoking a link that does not exist: the roles allowed pass the access check and get 404.
  "DELETE /api/projects/[projectId]/share-links/[linkId]": projectAction(404, READERS),
  // A read-only link's token is the authorization: one never issued is not found for everyone
  // (an expired or revoked one is gone, 410: share-board.spec.ts).
  "GET /api/share/[token]/reports/[pourId]/[revision]": everyone(404),
  // Public: a report file's sha256 in, whether it is a signed revision out (audited).
  "POST /api/report-verifications": everyone(200),
  "GET /api/projects/[projectId]/tendons/[tendonId]": projectAction(200, MEMBERS),
  "GET /api/projects/[projectId]/strand-lots": projectAction(200, MEMBERS),
  "POST /api/projects/[projectId]/strand-lots": projectAction(201, ["admin"]),
  "PATCH /api/projects/[projectId]/strand-lots/[strandLotId]": projectAction(200, ["admin"]),
  "PATCH /api/projects/[projectId]/tendons/[tendonId]": projectAction(200, ["admin"]),
  "POST /api/projects/[projectId]/strand-lots/[strandLotId]/preview": projectAction(200, ["admin"]),
  "POST /api/projects/[projectId]/tendons/[tendonId]/preview": projectAction(200, ["admin"]),
  "GET /api/projects/[projectId]/equipment-sets": projectAction(200, MEMBERS),
  "POST /api/projects/[projectId]/equipment-sets": projectAction(201, ["admin"]),
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations": projectAction(201, ["admin"]),
  // Retiring or correcting a calibration that does not exist: the admin passes the access check and gets 404.
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement": projectAction(404, [
    "admin",
  ]),
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction": projectAction(404, [
    "admin",
  ]),
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/correction/preview":
    projectAction(404, ["admin"]),
  // The previews of adding a calibration to a set that does not exist, and of retiring one that does not: 404.
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/preview": projectAction(404, ["admin"]),
  "POST /api/projects/[projectId]/equipment-sets/[setId]/calibrations/[calibrationId]/retirement/preview":
    projectAction(404, ["admin"]),
  // Flags, reviews, dispositions and corrections on an id that does not exist: the roles allowed
  // pass the access check and get 404 from the operation; the release is refused by the
  // project's rule (inspector: 403) or by the pour's unstressed tendons (engineer: 409).
  "GET /api/projects/[projectId]/flags": projectAction(200, ["inspector", "engineer"]),
  "POST /api/projects/[projectId]/flags/[flagId]/reviews": projectAction(404, ["inspector", "engineer"]),
  "POST /api/projects/[projectId]/flags/[flagId]/dispositions": projectAction(404, ["engineer"]),
  "POST /api/projects/[projectId]/records/[recordId]/corrections": projectAction(404, ["inspector"]),
  "POST /api/projects/[projectId]/pours/[pourId]/release": { ...projectAction(409, ["engineer"]), inspector: 403 },
  // Concrete results: every member reads them; the inspector and the admin enter them (on a pour
  // id that does not exist, so the allowed roles pass the access check and get 404).
  "GET /api/projects/[projectId]/pours/[pourId]/concrete-results": projectAction(200, MEMBERS),
  "POST /api/projects/[projectId]/pours/[pourId]/concrete-results": projectAction(404, ["inspector", "admin"]),
  // Only the engineer reopens; the pour named is not released, so the engineer gets 409.
  "POST /api/projects/[projectId]/pours/[pourId]/reopen": projectAction(409, ["engineer"]),
  // Token routes: the token is the authorization, so every caller gets the same answer.
  "POST /api/invitations/accept": everyone(410),
  "POST /api/password-reset": everyone(202),
  "POST /api/password-reset/complete": everyone(410),
  // Field log and sync: any stressing crew member (each op and pour is then checked per project).
  "GET /api/field/pours": { ...signedIn(403), crew: 200, other: 200 },
  "GET /api/field/pours/[pourId]": projectAction(200, ["crew"]),
  "POST /api/sync/push": { ...signedIn(403), crew: 200, other: 200 },
  "GET /api/sync/pull": { ...signedIn(403), crew: 200, other: 200 },
};

/** Files with "use server" (server actions). Tautline has none: mutations are route handlers. */
export const SERVER_ACTION_FILES: string[] = [];
