import type { Role } from "@/lib/schemas/domain";

/**
 * The one permission table: which project role may do what. Anything not listed is denied.
 * Field-level rules live beside the operations (only engineers write dispositions; nobody edits
 * a submitted measurement in place).
 */
export const PERMISSIONS = {
  "project.view": ["crew", "inspector", "engineer", "admin"],
  "project.configure": ["admin"],
  "members.view": ["admin"],
  "members.manage": ["admin"],
  "schedule.view": ["crew", "inspector", "engineer", "admin"],
  "schedule.manage": ["admin"],
  "equipment.manage": ["admin"],
  "record.create": ["crew"],
  "record.view": ["crew", "inspector", "engineer", "admin"],
  "record.correct": ["inspector"],
  // The lab's concrete results for a pour, which confirm (or not) its strength for stressing.
  "concrete.confirm": ["inspector", "admin"],
  "flag.review": ["inspector", "engineer"],
  "disposition.create": ["engineer"],
  // The engineer's own choice of one e-mail per flag or a digest per shift.
  "flag_mail.choose": ["engineer"],
  // Which of the two releases a given project is the project's own rule (projects.release_by).
  "pour.release": ["inspector", "engineer"],
  // Undoing a release is the engineer of record's act alone, with a reason.
  "pour.reopen": ["engineer"],
  "report.download": ["inspector", "engineer", "admin"],
  // The special inspector signs the pour's stressing report and the day's inspection report.
  "report.sign": ["inspector"],
  // Read-only links to the status board for the general contractor and the building official.
  "share.manage": ["inspector", "engineer", "admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

/** Who may upload (and confirm) each kind of file: the action behind the file's purpose. */
export const UPLOAD_PERMISSION = {
  mill_certificate: "schedule.manage",
  calibration_certificate: "equipment.manage",
  record_photo: "record.create",
  review_photo: "flag.review",
  lab_report: "concrete.confirm",
  // Never presigned (not an upload purpose); a signed report is stored by the signing itself.
  signed_report: "report.sign",
} as const satisfies Record<
  "mill_certificate" | "calibration_certificate" | "record_photo" | "review_photo" | "lab_report" | "signed_report",
  Action
>;

export function can(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role);
}

export const ROLES: readonly Role[] = ["crew", "inspector", "engineer", "admin"];

export const ROLE_LABELS: Record<Role, string> = {
  crew: "Stressing crew",
  inspector: "Special inspector",
  engineer: "Engineer of record",
  admin: "Project admin",
};
