import { z } from "zod/mini";

/**
 * GET /api/me: who is signed in and on which projects. The route sends it through this schema and
 * the tablet parses it before keeping the person for offline work (lib/offline/open-field.ts).
 * zod/mini, like the sync contracts, for the tablet's sync chunk.
 */
export const meResponseSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  isOperator: z.boolean(),
  memberships: z.array(
    z.object({ projectId: z.string(), projectName: z.string(), projectCode: z.string(), role: z.string() }),
  ),
});
export type MeResponse = z.infer<typeof meResponseSchema>;
