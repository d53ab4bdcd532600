import { z } from 'zod';

// Photos: the form fields of an upload (besides the file itself), and what the server answers.
// Shared by the photo control (components/photos) and the server.

/** Upload limits the client shows and checks before sending; the server checks them again (lib/images.ts). */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
export const PHOTOS_PER_CALL = 60;
export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp,image/avif,image/heic,image/*';

const optionalId = (label: string) =>
  z
    .union([z.uuid({ error: `${label} must be the id of one of this call's records.` }), z.literal('')], {
      error: `${label} must be the id of one of this call's records.`,
    })
    .optional()
    .transform((v) => v || undefined);

/** The text fields of POST /api/calls/{id}/attachments (multipart form-data beside `file`). */
export const uploadFieldsSchema = z.object(
  {
    answerId: optionalId('answerId'),
    findingId: optionalId('findingId'),
  },
  { error: 'The upload fields are not valid.' },
);
export type UploadFields = z.output<typeof uploadFieldsSchema>;

/** The answer of POST /api/calls/{id}/attachments (201). */
export const uploadedSchema = z.object({
  id: z.string(),
  url: z.string(),
  thumbnailUrl: z.string(),
});

export const attachmentSchema = z.object({
  id: z.string(),
  url: z.string(),
  thumbnailUrl: z.string(),
  answerId: z.string().nullable(),
  /** The client id of that answer: the wizard knows its answers by it. */
  answerClientId: z.string().nullable().default(null),
  findingId: z.string().nullable(),
  width: z.number().int(),
  height: z.number().int(),
  size: z.number().int(),
  ownerName: z.string().nullable(),
  createdAt: z.coerce.date(),
});
export type AttachmentOut = z.output<typeof attachmentSchema>;

/** GET /api/calls/{id}/attachments: the call's photos, and whether they may still be added or removed. */
export const attachmentListSchema = z.object({
  photos: z.array(attachmentSchema),
  editable: z.boolean(),
});
export type AttachmentListOut = z.output<typeof attachmentListSchema>;

export const removedSchema = z.object({ id: z.string(), removed: z.literal(true) });
