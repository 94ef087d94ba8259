/** "F-0012", "D-0007": a flag's or a disposition's number in its project, in the order they were made. */
export const reference = (prefix: "F" | "D", n: number): string => `${prefix}-${String(n).padStart(4, "0")}`;

/**
 * The reference a flag about to be written will have: the project had `existing` flags; flags made
 * together share their creation time and are numbered in the order of their ids, as the screens
 * and the report count them ((created_at, id) order).
 */
export function newFlagReference(existing: number, together: { id: string }[], id: string): string {
  const ids = together.map((f) => f.id).sort();
  return reference("F", existing + ids.indexOf(id) + 1);
}
