import type { Role } from "@/db/types";

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
  "flag.review": ["inspector", "engineer"],
  "disposition.create": ["engineer"],
  "pour.release": ["engineer"],
  "report.download": ["inspector", "engineer", "admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

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
