import type { z } from "zod";
import type { FieldErrors } from "@/lib/errors";

/**
 * Every message of a zod failure, grouped by the field it names ("_" for the whole body). A field
 * the schema does not know (strict request schemas) is named itself, so the answer says which one
 * to drop; its name comes from the sender, so it is set as an own property ("__proto__" too).
 */
export function zodFields(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  const add = (key: string, message: string) => {
    if (Object.hasOwn(fields, key)) fields[key]!.push(message);
    else Object.defineProperty(fields, key, { value: [message], enumerable: true, writable: true, configurable: true });
  };
  for (const issue of error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys) {
        add([...issue.path, key].join("."), `Unknown field "${key.slice(0, 60)}": this form has no such field.`);
      }
      continue;
    }
    add(issue.path.length ? issue.path.join(".") : "_", issue.message);
  }
  return fields;
}
