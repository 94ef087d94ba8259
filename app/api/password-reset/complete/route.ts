import { db } from "@/db";
import { route } from "@/lib/http/route";
import { passwordResetSchema } from "@/lib/schemas/account";
import { resetPassword } from "@/lib/server/reset-password";

// Open to anyone holding a valid reset link: the token is the authorization.
export const POST = route({ access: "public", body: passwordResetSchema }, async ({ body }) => {
  const { email } = await resetPassword(db, body);
  return { email };
});
