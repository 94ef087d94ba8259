import { db } from "@/db";
import { route } from "@/lib/http/route";
import { pushRequestSchema } from "@/lib/schemas/sync";
import { pushResponseSchema } from "@/lib/schemas/sync-response";
import { pushOps } from "@/lib/server/push-ops";
import { requireRecorder } from "@/lib/server/require-recorder";

// The tablet's outbox lands here: one answer per operation, each op in its own transaction.
export const POST = route(
  { body: pushRequestSchema, access: () => requireRecorder(), response: pushResponseSchema },
  async ({ body, access: user }) => pushOps(db, { user, deviceId: body.deviceId, ops: body.ops }),
);
