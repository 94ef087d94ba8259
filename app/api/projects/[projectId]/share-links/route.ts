import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { env } from "@/lib/env";
import { route } from "@/lib/http/route";
import { shareLinkSchema } from "@/lib/schemas/share-link";
import { createShareLink, listShareLinks } from "@/lib/server/manage-share-links";

const params = z.object({ projectId: z.uuid({ error: "Not a project id." }) });

/** The project's read-only links, without their tokens. */
export const GET = route(
  { params, access: ({ params }) => authorize("share.manage", params.projectId) },
  async ({ params }) => listShareLinks(db, params),
);

/** A new read-only link; its address (with the token) is shown this once. */
export const POST = route(
  { params, body: shareLinkSchema, access: ({ params }) => authorize("share.manage", params.projectId) },
  async ({ params, body, access }) => {
    const link = await createShareLink(db, { projectId: params.projectId, by: { id: access.user.id }, values: body });
    return NextResponse.json(
      { linkId: link.linkId, url: `${env.APP_URL}/share/${link.token}`, expiresAt: link.expiresAt },
      { status: 201 },
    );
  },
);
