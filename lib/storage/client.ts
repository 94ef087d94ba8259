import "server-only";
import { S3Client } from "@aws-sdk/client-s3";
import { env } from "@/lib/env";

let client: S3Client | undefined;

/**
 * The one S3 client. Against the local fake, checksums are computed only when an operation
 * requires them (otherwise streamed uploads are stored with their chunk framing); real S3 keeps
 * the SDK defaults.
 */
export function s3(): S3Client {
  client ??= new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    ...(env.S3_CHECKSUMS_WHEN_REQUIRED
      ? { requestChecksumCalculation: "WHEN_REQUIRED" as const, responseChecksumValidation: "WHEN_REQUIRED" as const }
      : {}),
  });
  return client;
}

export const bucket = (): string => env.S3_BUCKET;
