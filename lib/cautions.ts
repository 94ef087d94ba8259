/**
 * The one wording of Tautline's cautions. Every screen, e-mail and report that shows a verdict
 * carries both; the tablet's record form carries the stressing safety caution beside Save. Pure
 * strings, no React, so the mail, the PDF and the tablet share them. Wording is Tautline's own.
 */

/** Who decides: the figures support the engineer of record; codes and the engineer govern. */
export const ENGINEERING_CAUTION =
  "These figures support the licensed engineer of record; they do not replace the engineer's judgment. " +
  "Local codes, the project specifications and the engineer's instructions govern.";

/** The regulation the stressing safety caution follows, named where the caution is shown. */
export const STRESSING_SAFETY_RULE = "OSHA 29 CFR 1926.701(c)";

/** Where people stand while a tendon is stressed. */
export const STRESSING_SAFETY_CAUTION =
  "Stressing is dangerous work: nobody stands behind the jack or in line with the tendon at either end while it is under pressure, " +
  `and the stressing zone is barricaded and signed (${STRESSING_SAFETY_RULE}).`;

/** Both, in this order: the words shown beside every verdict, disposition and report. */
export const CAUTION_TEXT = `${ENGINEERING_CAUTION} ${STRESSING_SAFETY_CAUTION}`;

/** The one-line form for e-mail footers. */
export const CAUTION_LINE = `Caution: ${CAUTION_TEXT}`;
