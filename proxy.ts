import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";
import { contentSecurityPolicy, newNonce } from "@/lib/http/content-security-policy";

/**
 * Runs before every page: a fresh nonce per request, in the Content-Security-Policy sent to the
 * browser and in the request's copy, from which Next.js takes it for the page's scripts. Route
 * handlers, build assets and the worker script keep the static headers of next.config.mjs.
 */
const uploadOrigin = new URL(env.S3_ENDPOINT).origin;

export function proxy(request: NextRequest) {
  const policy = contentSecurityPolicy({
    nonce: newNonce(),
    dev: env.NODE_ENV === "development",
    connectOrigins: [uploadOrigin],
  });
  const headers = new Headers(request.headers);
  headers.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("Content-Security-Policy", policy);
  return response;
}

export const config = {
  matcher: [
    "/((?!api/|_next/static/|_next/image|sw\\.js|manifest\\.webmanifest|icon\\.svg|icons/|favicon\\.ico|tour/).*)",
  ],
};
