import { db } from "@/db";
import { clientIp, route } from "@/lib/http/route";
import { sharedReportParamsSchema } from "@/lib/schemas/share-link";
import { readSharedReport } from "@/lib/server/get-share-board";

/** Public through a read-only link: a signed stressing report as signed. The token is the authorization. */
export const GET = route({ params: sharedReportParamsSchema, access: "public" }, async ({ params, request }) => {
  const file = await readSharedReport(db, { ...params, ip: clientIp(request) });
  return new Response(new Uint8Array(file.body), { headers: file.headers });
});
