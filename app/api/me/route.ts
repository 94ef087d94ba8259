import { requireUser } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { meResponseSchema } from "@/lib/schemas/me";

export const GET = route({ access: () => requireUser(), response: meResponseSchema }, async ({ access: user }) => ({
  id: user.id,
  email: user.email,
  name: user.name,
  isOperator: user.isOperator,
  memberships: user.memberships,
}));
