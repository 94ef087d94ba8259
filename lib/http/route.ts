import "server-only";
import { randomUUID } from "node:crypto";
import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { env } from "@/lib/env";
import { AppError, isAppError, type FieldErrors } from "@/lib/errors";
import { zodFields } from "@/lib/schemas/zod-fields";
import { clientAddress } from "./client-address";
import { databaseRefusal } from "@/lib/server/database-refusal";
import { isInputError } from "@/lib/units";

/**
 * The one wrapper every Tautline route handler goes through.
 * - Mutating methods must come from our own origin (Origin or Sec-Fetch-Site) and, when they
 *   carry a body, as JSON: this is the CSRF defence for route handlers, which Next.js does not give.
 * - The body and the route params are parsed with zod; failures answer 422 naming each field.
 * - A route that declares a `response` schema has its answer parsed through it before it is sent.
 * - Every failure is answered by `errorResponse`: AppErrors with their status, the units' InputError
 *   and PostgreSQL's refusals in words; anything else is logged with a reference and answers 500.
 */

type Params = Record<string, string | string[]>;
type Ctx = { params: Promise<Params> };

const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * A refusal's summary in the user's words: every distinct message once, without the schema's field
 * names ("requiredConcreteMPa" means nothing to a person). The names stay in `fields`, from which a
 * form puts each message beside its box.
 */
export function describeFields(fields: FieldErrors): string {
  const messages = [...new Set(Object.values(fields).flat())].map((m) => m.trim()).filter(Boolean);
  return messages.map((m) => (/[.!?]$/.test(m) ? m : `${m}.`)).join(" ");
}

/**
 * What a failure means to the caller, or null for a fault of ours: an AppError as it is, the
 * units' and the computation's InputError as bad input naming its field, and PostgreSQL's
 * refusal of a row in words (lib/server/database-refusal.ts).
 */
export function knownError(error: unknown): AppError | null {
  if (isAppError(error)) return error;
  if (isInputError(error)) {
    const fields = { [error.field]: [error.reason] };
    return new AppError("INVALID_INPUT", `Check the values: ${describeFields(fields)}`, fields);
  }
  return databaseRefusal(error);
}

/**
 * The one mapping from a thrown error to an HTTP answer. Anything not known answers 500 with a
 * reference that is also in the server's log beside the whole error; the answer itself never
 * carries the error's text, SQL, constraint names or a stack.
 */
export function errorResponse(error: unknown): NextResponse {
  const known = knownError(error);
  if (known) {
    return NextResponse.json(
      { error: { code: known.code, message: known.message, ...(known.fields ? { fields: known.fields } : {}) } },
      { status: known.status, headers: { "Cache-Control": "no-store" } },
    );
  }
  const reference = randomUUID().slice(0, 8);
  console.error(`route handler failed (reference ${reference})`, error);
  return NextResponse.json(
    {
      error: {
        code: "INTERNAL",
        message: `Something went wrong on the server (reference ${reference}). Try again; if it happens again, give this reference to whoever runs Tautline.`,
        reference,
      },
    },
    { status: 500, headers: { "Cache-Control": "no-store" } },
  );
}

export function assertSameOrigin(request: Request): void {
  const origin = request.headers.get("origin");
  const site = request.headers.get("sec-fetch-site");
  const allowed = new Set([new URL(env.APP_URL).origin, new URL(request.url).origin]);
  if (origin && origin !== "null") {
    if (!allowed.has(origin)) throw new AppError("BAD_ORIGIN", "This request did not come from a Tautline page.");
    return;
  }
  if (site === "same-origin") return;
  throw new AppError("BAD_ORIGIN", "This request did not come from a Tautline page (no same-origin Origin header).");
}

async function readJson(request: Request): Promise<unknown> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^application\/json\b/i.test(type)) {
    throw new AppError("UNSUPPORTED_MEDIA_TYPE", "Send the request body as JSON (Content-Type: application/json).");
  }
  const text = await request.text();
  if (!text.trim()) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("INVALID_INPUT", "The request body is not valid JSON.", { body: ["Not valid JSON."] });
  }
}

export function parseWith<T extends z.ZodType>(schema: T, value: unknown, where = "input"): z.infer<T> {
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = zodFields(result.error);
    throw new AppError("INVALID_INPUT", `Check the ${where}: ${describeFields(fields)}`, fields);
  }
  return result.data;
}

type Infer<S> = S extends z.ZodType ? z.infer<S> : undefined;

/** Who may call a route. "public" is for the few routes whose token is the authorization. */
type Access<P, A> = "public" | ((input: { params: P; request: NextRequest }) => Promise<A>);

/** A response schema: classic zod or zod/mini (the tablet's contracts, lib/schemas/sync-response.ts). */
type ResponseSchema = z.core.$ZodType;

interface RouteOptions<
  B extends z.ZodType | undefined,
  P extends z.ZodType | undefined,
  A,
  R extends ResponseSchema | undefined,
> {
  params?: P;
  body?: B;
  access: Access<Infer<P>, A>;
  /**
   * What the handler answers: the wrapper parses it before sending (unknown keys dropped), so a
   * caller gets exactly the contract. An answer that does not match is a fault of ours (500).
   */
  response?: R;
}

type Answer<R> = R extends ResponseSchema ? z.input<R> : unknown;

/**
 * Order matters: origin check, params, then access (so an anonymous caller always gets 401 and
 * a stranger 404 before any body is looked at), then the body.
 */
export function route<
  B extends z.ZodType | undefined = undefined,
  P extends z.ZodType | undefined = undefined,
  A = undefined,
  R extends ResponseSchema | undefined = undefined,
>(
  options: RouteOptions<B, P, A, R>,
  handler: (input: {
    request: NextRequest;
    body: Infer<B>;
    params: Infer<P>;
    access: A;
  }) => Promise<Response | Answer<R>>,
) {
  return async (request: NextRequest, ctx: Ctx): Promise<Response> => {
    try {
      if (MUTATING.has(request.method)) assertSameOrigin(request);
      const rawParams = (await ctx?.params) ?? {};
      const params = (options.params ? parseWith(options.params, rawParams, "address") : undefined) as Infer<P>;
      const access = (options.access === "public" ? undefined : await options.access({ params, request })) as A;
      let body = undefined as Infer<B>;
      if (options.body) body = parseWith(options.body, await readJson(request), "form") as Infer<B>;
      const result = await handler({ request, body, params, access });
      if (result instanceof Response) return result;
      const answer = options.response ? z.parse(options.response, result) : result;
      return NextResponse.json(answer ?? { ok: true }, { headers: { "Cache-Control": "no-store" } });
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** The caller's address when a trusted proxy tells it (lib/http/client-address.ts), else null. */
export function clientIp(request: Request): string | null {
  return clientAddress(request.headers);
}
