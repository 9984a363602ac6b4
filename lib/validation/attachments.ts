import { z } from "zod";
import { ALLOWED_ATTACHMENT_TYPES } from "../attachments/content-type";
import { MAX_ATTACHMENT_SIZE_TEXT } from "./limits";

/** The upload of POST /api/v1/shops/{shop}/attachments: one file in a multipart field named `file`. */
export const attachmentUploadSchema = z.object({
  file: z.file().meta({ description: `PDF, PNG, JPEG or DXF, judged by content; at most ${MAX_ATTACHMENT_SIZE_TEXT}` }),
});

/** What the upload answers: the stored file, to name in a request's `attachmentIds`. */
export const storedAttachmentSchema = z
  .object({
    id: z.uuid(),
    fileName: z.string(),
    sizeBytes: z.number().int().min(0),
    contentType: z.enum(ALLOWED_ATTACHMENT_TYPES),
  })
  .meta({ id: "StoredAttachment" });
