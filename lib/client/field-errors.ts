import type { FieldErrors } from "@/lib/errors";

/**
 * A route's 422 `fields` sorted between the boxes a form shows and the rest. `boxOf` names the box
 * a field path belongs to ("areaM2" → "area", "points.2.forceN" → "pointsText"), or nothing when
 * the form has no box for it; those messages go above the form (see `refusedWords`), so none is lost.
 */
export function placeFields(
  fields: FieldErrors | undefined,
  boxOf: (path: string) => string | null | undefined,
): { boxes: Record<string, string[]>; rest: string[] } {
  const boxes: Record<string, string[]> = {};
  const rest: string[] = [];
  for (const [path, messages] of Object.entries(fields ?? {})) {
    const box = path === "_" ? null : boxOf(path);
    if (box) (boxes[box] ??= []).push(...messages);
    else rest.push(...messages);
  }
  return { boxes, rest };
}

/**
 * The words above a refused form. The route's own message repeats every field's message (in words,
 * never the schema's names), so when the refusal came with fields the form says only what no box
 * shows and points at the marked boxes for the rest.
 */
export function refusedWords(
  error: { message: string; fields?: FieldErrors },
  placed: { boxes: Record<string, string[]>; rest: readonly string[] },
): string {
  if (!Object.keys(error.fields ?? {}).length) return error.message;
  const marked = Object.keys(placed.boxes).length;
  const unplaced = [...new Set(placed.rest)].join(" ");
  if (!unplaced) return `Not saved: check the marked field${marked > 1 ? "s" : ""}.`;
  return `Not saved: ${unplaced}${marked ? " Check the marked fields too." : ""}`;
}
