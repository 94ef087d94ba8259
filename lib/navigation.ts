import type { Role } from "@/lib/schemas/domain";

/** The signed-in areas of Tautline and which project roles see each in the navigation. */
export interface NavItem {
  href: string;
  label: string;
  description: string;
  roles: readonly Role[];
}

export const NAV_ITEMS: readonly NavItem[] = [
  {
    href: "/home",
    label: "Today",
    description: "What needs you now on your projects.",
    roles: ["crew", "inspector", "engineer", "admin"],
  },
  {
    href: "/field",
    label: "Field log",
    description: "Take pours out on the tablet and record each tendon end, with or without signal.",
    roles: ["crew"],
  },
  {
    href: "/review",
    label: "Flags to review",
    description: "Records outside the band or missing something, with their evidence.",
    roles: ["inspector", "engineer"],
  },
  {
    href: "/decisions",
    label: "Decisions",
    description: "Flags waiting for the engineer of record's disposition, and pours awaiting release.",
    roles: ["engineer"],
  },
  {
    href: "/setup",
    label: "Project setup",
    description: "Tolerance rule, tendon schedules, strand lots, equipment sets and people.",
    roles: ["admin"],
  },
];

export function navFor(roles: readonly Role[]): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.some((r) => roles.includes(r)));
}
