import "server-only";
import { AppError } from "@/lib/errors";
import { isReleasedPourRefusal, RELEASED_POUR_MESSAGE } from "./require-open-pour";

/**
 * A refusal by PostgreSQL of the row itself, put in our own words as an AppError; null for any
 * other failure (a lost connection, a bug), which stays a server fault. PostgreSQL's own text,
 * the constraint, table and column names and the values it quotes never go into the answer:
 * they name the schema and may quote another project's data.
 *
 * Operations that can name the field (a unique code, a signed revision) catch the SQLSTATE
 * themselves and throw their own AppError; this is the net under them.
 */
export function databaseRefusal(error: unknown): AppError | null {
  if (isReleasedPourRefusal(error)) return new AppError("CONFLICT", RELEASED_POUR_MESSAGE);
  const code = (error as { code?: unknown } | null)?.code;
  if (typeof code !== "string" || !/^[0-9A-Z]{5}$/.test(code)) return null;
  switch (code) {
    case "23505": // unique_violation
      return new AppError(
        "CONFLICT",
        "This would make a second copy of something that already exists. Nothing was saved.",
      );
    case "23P01": // exclusion_violation
      return new AppError("CONFLICT", "This overlaps something that already exists. Nothing was saved.");
    case "23503": // foreign_key_violation
      // A delete or update of a row that others still point at, or a row pointing at one that is gone.
      return /^update or delete on/.test((error as Error).message ?? "")
        ? new AppError("CONFLICT", "Other records still depend on this; it cannot be removed. Nothing was saved.")
        : new AppError(
            "INVALID_INPUT",
            "Something this refers to does not exist (or no longer does). Nothing was saved.",
            {
              form: ["Refers to something that does not exist. Reload and try again."],
            },
          );
    case "23502": // not_null_violation
      return new AppError("INVALID_INPUT", "A value that is required is missing. Nothing was saved.", {
        form: ["A required value is missing."],
      });
    case "23514": // check_violation
      return new AppError("INVALID_INPUT", "A value is outside what can be stored. Nothing was saved.", {
        form: ["A value is outside what can be stored."],
      });
  }
  // Any other integrity refusal (class 23): the row broke a rule of the schema.
  if (code.startsWith("23")) {
    return new AppError("INVALID_INPUT", "A value breaks a rule of what can be stored. Nothing was saved.", {
      form: ["A value cannot be stored as typed."],
    });
  }
  // Class 22, data exception: text PostgreSQL cannot store (a NUL that slipped past a schema, a
  // byte sequence it refuses), a value too long or a number out of range. The statement wrote nothing.
  if (code.startsWith("22")) {
    return new AppError(
      "INVALID_INPUT",
      "Some text holds characters that cannot be stored, or a value is too long or too large. Nothing was saved.",
      { form: ["A value cannot be stored as typed."] },
    );
  }
  return null;
}
