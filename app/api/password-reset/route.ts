import { NextResponse } from "next/server";
import { db } from "@/db";
import { clientIp, route } from "@/lib/http/route";
import { passwordResetRequestSchema } from "@/lib/schemas/account";
import { requestPasswordReset } from "@/lib/server/reset-password";
import { runInBackground } from "@/lib/server/run-in-background";

// Always the same answer, whether or not the address has an account.
export const POST = route({ access: "public", body: passwordResetRequestSchema }, async ({ request, body }) => {
  // In the background: the answer never waits on the lookup or the e-mail, so its timing says nothing.
  const ip = clientIp(request);
  runInBackground("password-reset", () => requestPasswordReset(db, { email: body.email, ip }));
  return NextResponse.json({ message: "If this address has an account, a reset link is on its way." }, { status: 202 });
});
