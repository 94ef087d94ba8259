import { db } from "@/db";
import { route } from "@/lib/http/route";
import { acceptInvitationSchema } from "@/lib/schemas/account";
import { acceptInvitation } from "@/lib/server/accept-invitation";

// Open to anyone holding a valid invitation link: the token is the authorization.
export const POST = route({ access: "public", body: acceptInvitationSchema }, async ({ body }) => {
  const result = await acceptInvitation(db, body);
  return { email: result.email, newAccount: result.newAccount };
});
