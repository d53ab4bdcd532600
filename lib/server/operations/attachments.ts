import 'server-only';
import { z } from 'zod';
import { attachmentLink, listCallAttachments, removeAttachment, uploadAttachment } from '@/lib/server/attachments';
import { defineOperation } from '@/lib/server/operation';
import { recordId } from '@/lib/server/operations/shared';
import { attachmentListSchema, removedSchema, uploadedSchema, uploadFieldsSchema } from '@/lib/validations/attachments';

// Photos of a call, its readings and observations, and its findings.

const size = z.enum(['display', 'thumb'], { error: 'size is thumb, or left out for the display size.' }).default('display');

// POST /api/calls/{id}/attachments (multipart: app/api/calls/[id]/attachments/route.ts)
export const uploadAttachmentOp = defineOperation({
  name: 'attachments.upload',
  input: z.object({
    id: recordId,
    fields: uploadFieldsSchema,
    file: z.custom<Buffer>((v) => Buffer.isBuffer(v), { error: 'Attach the photo as the form field "file".' }),
  }),
  fieldsUnder: 'fields',
  output: uploadedSchema,
  handler: async ({ scope, input }) => uploadAttachment({ scope, callId: input.id, fields: input.fields, file: input.file }),
});

// GET /api/calls/{id}/attachments
export const listAttachmentsOp = defineOperation({
  name: 'attachments.list',
  input: z.object({ id: recordId }),
  output: attachmentListSchema,
  handler: async ({ scope, input }) => listCallAttachments({ scope, callId: input.id }),
});

// GET /api/attachments/{id}: a redirect to a short-lived signed link (app/api/attachments/[id]/route.ts,
// which serves the bytes itself to the app's own <img> elements under the same check).
export const attachmentLinkOp = defineOperation({
  name: 'attachments.get',
  input: z.object({ id: recordId, size }),
  output: z.object({ url: z.string() }),
  handler: async ({ scope, input }) => attachmentLink({ scope, id: input.id, size: input.size }),
});

// DELETE /api/attachments/{id}
export const removeAttachmentOp = defineOperation({
  name: 'attachments.delete',
  input: z.object({ id: recordId }),
  output: removedSchema,
  handler: async ({ scope, input }) => removeAttachment({ scope, id: input.id }),
});
