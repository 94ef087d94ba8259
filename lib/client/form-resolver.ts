import type { FieldErrors, FieldValues, Resolver } from "react-hook-form";
import type { z } from "zod";

type Shape = Record<string, z.ZodType>;
type Parsed<S extends Shape> = { [K in keyof S]: z.output<S[K]> | null };
type Typed<S extends Shape> = { [K in keyof S]: z.input<S[K]> };

/**
 * A react-hook-form resolver for forms whose boxes hold what a person typed (lengths with units,
 * numbers) and whose result is one of the shared SI schemas. Unlike a single piped zod schema,
 * which stops at the first stage that fails, it reads every box, then checks the SI schema with
 * what could be read, so every message shows at once. An SI field's message goes to the box it
 * came from (`paths`: SI name → box name); a message no box owns goes to `root`, for the form to
 * show above itself, so nothing is ever refused without a word. A box holding a list (rows of
 * segments) gets one message naming each row at fault (`rows`: box name → what a row is called).
 */
export function formResolver<S extends Shape, Out extends FieldValues>(
  fields: S,
  toSi: (values: Parsed<S>) => unknown,
  si: z.ZodType<Out>,
  paths: Record<string, keyof S & string> = {},
  rows: Partial<Record<keyof S & string, string>> = {},
): Resolver<Typed<S> & FieldValues, unknown, Out> {
  const say = (box: string, issue: z.core.$ZodIssue, from: number) => {
    const index = issue.path.slice(from).find((p) => typeof p === "number");
    const row = rows[box as keyof S & string];
    return row && typeof index === "number" ? `${row} ${index + 1}: ${issue.message}` : issue.message;
  };
  return async (values) => {
    const errors: Record<string, { type: string; message: string }> = {};
    const read: Record<string, unknown> = {};
    for (const [key, schema] of Object.entries(fields)) {
      const result = schema.safeParse((values as Record<string, unknown>)[key]);
      if (result.success) read[key] = result.data;
      else {
        read[key] = null;
        errors[key] = { type: "invalid", message: result.error.issues.map((i) => say(key, i, 0)).join(" ") };
      }
    }
    const out = si.safeParse(toSi(read as Parsed<S>));
    if (out.success && Object.keys(errors).length === 0) return { values: out.data, errors: {} };
    if (!out.success) {
      for (const issue of out.error.issues) {
        const top = String(issue.path[0] ?? "");
        const box = paths[top] ?? top;
        const target = box in fields ? box : "root";
        const existing = errors[target];
        const message = say(target, issue, 1);
        if (!existing) errors[target] = { type: "invalid", message };
        else if (target === "root" && !existing.message.includes(message)) existing.message += ` ${message}`;
      }
    }
    return { values: {}, errors: errors as FieldErrors<Typed<S> & FieldValues> };
  };
}
