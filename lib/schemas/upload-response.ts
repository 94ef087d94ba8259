import { z } from "zod/mini";

/**
 * POST /api/projects/:id/uploads answers with a presigned PUT: the route sends it through this
 * schema and the tablet parses it before uploading a photo (lib/offline/photo-upload.ts). zod/mini,
 * like the sync contracts, for the tablet's sync chunk.
 */
export const presignUploadResponseSchema = z.object({
  attachmentId: z.string(),
  uploadUrl: z.string(),
  headers: z.record(z.string(), z.string()),
  expiresInSeconds: z.number(),
});
export type PresignUploadResponse = z.infer<typeof presignUploadResponseSchema>;
