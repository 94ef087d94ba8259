import { formatDateTime } from "@/lib/format/dates";
import { type DisplayUnits, showStrength } from "@/lib/format/quantities";
import type { ConcreteSpecimen } from "@/lib/schemas/domain";

/**
 * One concrete test result in words, the same on the pour's stressing report and the day's
 * inspection report: "3,500 psi at 3 days, 2 cylinders, lab report L2-P1-3day.pdf, entered by
 * Ana Ruiz 2026-11-18 10:05 CST". Strength in the project's units, the time in the project's zone.
 * Pure.
 */
export interface ConcreteResultWords {
  specimen: ConcreteSpecimen;
  strengthMPa: number;
  ageDays: number;
  specimenCount: number;
  /** The laboratory's report by its file name; null when none was attached. */
  labReport: string | null;
  enteredBy: string;
  at: Date;
}

export function concreteResultText(
  units: Pick<DisplayUnits, "unitSystem">,
  timeZone: string,
  c: ConcreteResultWords,
): string {
  return (
    `${showStrength(units, c.strengthMPa)} at ${c.ageDays} day${c.ageDays === 1 ? "" : "s"}, ` +
    `${c.specimenCount} ${c.specimen}${c.specimenCount === 1 ? "" : "s"}, ` +
    `${c.labReport ? `lab report ${c.labReport}` : "no lab report attached"}, ` +
    `entered by ${c.enteredBy} ${formatDateTime(c.at, timeZone)}`
  );
}
