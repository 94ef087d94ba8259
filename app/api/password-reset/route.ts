import { NextResponse } from "next/server";
import { db } from "@/db";
import { clientIp, route } from "@/lib/http/route";
import { passwordResetRequestSchema } from "@/lib/schemas/account";
import { requestPasswordReset } from "@/lib/server/reset-password";

// Always the same answer, whether or not the address has an account.
export const POST = route({ access: "public", body: passwordResetRequestSchema }, async ({ request, body }) => {
  await requestPasswordReset(db, { email: body.email, ip: clientIp(request) });
  return NextResponse.json(
    { message: "If this address has an account, a reset link is on its way." },
    { status: 202 },
  );
});
