/**
 * A typed error with a closed set of codes, mapped to an HTTP status in one place.
 * Server operations throw these; `errorResponse` in lib/http/route.ts is the one place that turns
 * them (and the units' InputError, and PostgreSQL's refusals through lib/server/database-refusal.ts)
 * into JSON answers. Nothing else in app/api or lib writes an error status by hand.
 */
export const ERROR_STATUS = {
  UNAUTHENTICATED: 401,
  FORBIDDEN: 403,
  BAD_ORIGIN: 403,
  NOT_FOUND: 404,
  CONFLICT: 409,
  GONE: 410,
  UNSUPPORTED_MEDIA_TYPE: 415,
  INVALID_INPUT: 422,
  RATE_LIMITED: 429,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

/** Field path → messages, as zod reports them (`"points.0.forceN": ["…"]`). */
export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fields?: FieldErrors;

  /** Bad input always names its field(s), so a form can put the words beside the box. */
  constructor(code: "INVALID_INPUT", message: string, fields: FieldErrors);
  constructor(code: Exclude<ErrorCode, "INVALID_INPUT">, message: string, fields?: FieldErrors);
  constructor(code: ErrorCode, message: string, fields?: FieldErrors) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.fields = fields;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

/** The codes a push result may carry: the same set, plus the sync's own two. */
export type OpErrorCode = ErrorCode | "RELEASED" | "RETRY_LATER";

export const isAppError = (e: unknown): e is AppError => e instanceof AppError;
