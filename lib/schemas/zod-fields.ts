import type { z } from "zod";
import type { FieldErrors } from "@/lib/errors";

/** Every message of a zod failure, grouped by the field it names ("_" for the whole body). */
export function zodFields(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}
