import NextAuth from "next-auth";
import type { NextRequest } from "next/server";
import { refuseBadCallbackUrl } from "@/lib/auth/callback-url";
import { authOptions } from "@/lib/auth/options";

const handler = NextAuth(authOptions);

// A callbackUrl that is not one of our pages answers 400 here, before next-auth sees it.
async function guarded(request: NextRequest, ctx: { params: Promise<{ nextauth: string[] }> }) {
  return (await refuseBadCallbackUrl(request)) ?? handler(request, ctx);
}

export { guarded as GET, guarded as POST };
