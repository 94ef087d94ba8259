import { db } from "@/db";
import { parseWith, route } from "@/lib/http/route";
import { pullQuerySchema } from "@/lib/schemas/sync";
import { pullAnswer, pullAnswerSchema } from "@/lib/schemas/sync-response";
import { pullChanges } from "@/lib/server/pull-changes";
import { requireRecorder } from "@/lib/server/require-recorder";

// GET /api/sync/pull?cursor=…&pours=id,id — changes since the server-assigned cursor.
export const GET = route(
  { access: () => requireRecorder(), response: pullAnswerSchema },
  async ({ request, access: user }) => {
    const query = parseWith(pullQuerySchema, Object.fromEntries(request.nextUrl.searchParams), "query");
    return pullAnswer(await pullChanges(db, { user, cursor: query.cursor, pourIds: query.pours }));
  },
);
