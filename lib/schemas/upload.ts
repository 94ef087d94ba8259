import { z } from "zod";
import { text } from "./text";
import { UPLOAD_PURPOSES, type AttachmentPurpose } from "./domain";

const IMAGES = ["image/jpeg", "image/png", "image/webp"] as const;
const CERTIFICATES = ["application/pdf", "image/jpeg", "image/png"] as const;

/** The file types each purpose's content may be (checked by magic bytes). */
export const ALLOWED_TYPES: Record<AttachmentPurpose, readonly string[]> = {
  signed_report: ["application/pdf"],
  mill_certificate: CERTIFICATES,
  calibration_certificate: CERTIFICATES,
  record_photo: IMAGES,
  review_photo: IMAGES,
  lab_report: CERTIFICATES,
};

export const PURPOSE_LABELS: Record<AttachmentPurpose, string> = {
  signed_report: "signed report",
  mill_certificate: "mill certificate",
  calibration_certificate: "calibration certificate",
  record_photo: "gauge or tendon photo",
  review_photo: "review photo",
  lab_report: "lab report",
};

/** Plain words for the accepted types, for messages and the file picker's hint. */
export function acceptedTypesText(purpose: AttachmentPurpose): string {
  return ALLOWED_TYPES[purpose].map((t) => t.split("/")[1]!.toUpperCase()).join(", ");
}

export const presignUploadSchema = z
  .strictObject({
    purpose: z.enum(UPLOAD_PURPOSES, { error: "Say what the file is for." }),
    contentType: text().trim().min(3, "Say what type of file this is.").max(100),
    sizeBytes: z
      .number({ error: "Give the file size in bytes." })
      .int("Give the size in whole bytes.")
      .positive("The file is empty."),
    originalName: text().trim().min(1, "Give the file a name.").max(200, "Use a file name of at most 200 characters."),
    recordId: z.uuid({ error: "Not a record id." }).optional(),
  })
  .superRefine((value, ctx) => {
    if (!ALLOWED_TYPES[value.purpose].includes(value.contentType)) {
      ctx.addIssue({
        code: "custom",
        path: ["contentType"],
        message: `A ${PURPOSE_LABELS[value.purpose]} must be ${acceptedTypesText(value.purpose)}.`,
      });
    }
  });
export type PresignUploadInput = z.infer<typeof presignUploadSchema>;

export const attachmentParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  attachmentId: z.uuid({ error: "Not a file id." }),
});
