import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { errorResponse } from "@/lib/http/route";
import { hasControlCharacters } from "@/lib/schemas/text";

/**
 * Where next-auth may send someone after signing in or out: a path of ours ("/home"), or a full
 * address on our own origin. Anything else (another site, "//evil", a string that is not an
 * address) is refused with 422 naming the field before next-auth sees it; next-auth answered some with a 500.
 */
export function isSafeCallbackUrl(value: string): boolean {
  if (value.length > 2000 || hasControlCharacters(value)) return false;
  if (value.startsWith("/")) return !value.startsWith("//") && !value.startsWith("/\\");
  try {
    const origin = new URL(value).origin;
    return origin === new URL(env.APP_URL).origin || origin === new URL(env.NEXTAUTH_URL).origin;
  } catch {
    return false;
  }
}

const COOKIE = /(?:^|;\s*)(?:__Secure-)?next-auth\.callback-url=([^;]*)/;

/** The 422 for a bad callbackUrl in the query, the form body or next-auth's cookie; null when all is well. */
export async function refuseBadCallbackUrl(request: Request): Promise<Response | null> {
  const found: string[] = [];
  const query = new URL(request.url).searchParams.getAll("callbackUrl");
  found.push(...query);
  const type = request.headers.get("content-type") ?? "";
  if (request.method === "POST" && /application\/x-www-form-urlencoded/i.test(type)) {
    const form = new URLSearchParams(await request.clone().text());
    found.push(...form.getAll("callbackUrl"));
  }
  const cookie = request.headers.get("cookie")?.match(COOKIE)?.[1];
  if (cookie) {
    try {
      found.push(decodeURIComponent(cookie));
    } catch {
      found.push("\u0000");
    }
  }
  if (found.every(isSafeCallbackUrl)) return null;
  return errorResponse(
    new AppError("INVALID_INPUT", "The address to return to after signing in is not one of Tautline's pages.", {
      callbackUrl: ["Use a page of this site, such as /home."],
    }),
  );
}
