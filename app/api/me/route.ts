import { requireUser } from "@/lib/auth/session";
import { route } from "@/lib/http/route";

export const GET = route({ access: () => requireUser() }, async ({ access: user }) => ({
  id: user.id,
  email: user.email,
  name: user.name,
  isOperator: user.isOperator,
  memberships: user.memberships,
}));
