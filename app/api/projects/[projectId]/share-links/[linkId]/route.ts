import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { shareLinkParamsSchema } from "@/lib/schemas/share-link";
import { revokeShareLink } from "@/lib/server/manage-share-links";

/** Revokes a read-only link: it stops working at once. */
export const DELETE = route(
  { params: shareLinkParamsSchema, access: ({ params }) => authorize("share.manage", params.projectId) },
  async ({ params, access }) => revokeShareLink(db, { ...params, by: { id: access.user.id } }),
);
