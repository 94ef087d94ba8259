/** "F-0012", "D-0007": a flag's or a disposition's number in its project, in the order they were made. */
export const reference = (prefix: "F" | "D", n: number): string => `${prefix}-${String(n).padStart(4, "0")}`;

/**
 * Stands in a flag e-mail for the reference of a flag not yet written: its number is given by the
 * database at insert (the flags_reference_number trigger), and the insert of the e-mail puts the
 * reference in its place in the same statement (`evaluationWrites`).
 */
export const flagReferenceToken = (flagId: string): string => `{flag-reference:${flagId}}`;
