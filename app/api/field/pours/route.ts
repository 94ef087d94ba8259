import { db } from "@/db";
import { route } from "@/lib/http/route";
import { availablePoursResponseSchema } from "@/lib/schemas/sync-response";
import { listFieldPours } from "@/lib/server/list-field-pours";
import { requireRecorder } from "@/lib/server/require-recorder";

// The pours a crew member may take out for offline work.
export const GET = route(
  { access: () => requireRecorder(), response: availablePoursResponseSchema },
  async ({ access: user }) => listFieldPours(db, user),
);
