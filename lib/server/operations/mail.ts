import 'server-only';
import { z } from 'zod';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import { getNotificationSettings, updateNotificationSettings } from '@/lib/server/notify';
import { previewReportEmail, readMailbox, reportPdf, resendMessage, sendReportEmail } from '@/lib/server/outbox';
import {
  mailboxSchema,
  notificationSettingsOutSchema,
  notificationSettingsSchema,
  queuedMailSchema,
  reportEmailPreviewSchema,
  reportEmailSchema,
  resendSchema,
} from '@/lib/validations/mail';

// The report as PDF and by e-mail, the outbox's resend, the dev mailbox and the notification settings.

// GET /api/calls/{id}/report.pdf (binary: app/api/calls/[id]/report.pdf/route.ts)
export const reportPdfOp = defineOperation({
  name: 'reports.pdf',
  input: z.object({
    id: recordId,
    version: z.enum(['customer', 'office'], { error: 'The version is customer or office.' }).default('customer'),
  }),
  output: z.object({ filename: z.string(), pdf: z.custom<Buffer>((v) => Buffer.isBuffer(v), { error: 'The PDF was not made.' }) }),
  handler: async ({ scope, input }) => reportPdf({ scope, id: input.id, version: input.version }),
});

// GET /api/calls/{id}/report-email
export const reportEmailPreviewOp = defineOperation({
  name: 'reports.emailPreview',
  input: z.object({ id: recordId }),
  output: reportEmailPreviewSchema,
  handler: async ({ scope, input }) => previewReportEmail({ scope, id: input.id }),
});

// POST /api/calls/{id}/report-email · sendReportEmailAction
export const sendReportEmailOp = defineOperation({
  name: 'reports.email',
  input: z.object({ id: recordId, email: reportEmailSchema }),
  fieldsUnder: 'email',
  output: queuedMailSchema,
  handler: async ({ scope, input }) => sendReportEmail({ scope, id: input.id, input: input.email }),
});

// POST /api/outbox/{id}/resend · resendMailAction
export const resendMailOp = defineOperation({
  name: 'mail.resend',
  input: z.object({ id: recordId }).extend(resendSchema.shape),
  output: queuedMailSchema,
  handler: async ({ scope, input }) => resendMessage({ scope, id: input.id, idempotencyKey: input.idempotencyKey }),
});

// GET /api/dev/mailbox (attachments: app/api/dev/mailbox/[name]/[part]/route.ts)
export const mailboxOp = defineOperation({
  name: 'mail.mailbox',
  input: noInput,
  output: mailboxSchema,
  handler: async () => readMailbox(),
});

// GET /api/me/notifications
export const getNotificationSettingsOp = defineOperation({
  name: 'notifications.get',
  input: noInput,
  output: notificationSettingsOutSchema,
  handler: async ({ scope }) => getNotificationSettings({ scope }),
});

// PUT /api/me/notifications · updateNotificationSettingsAction
export const updateNotificationSettingsOp = defineOperation({
  name: 'notifications.update',
  input: notificationSettingsSchema,
  output: notificationSettingsOutSchema,
  handler: async ({ scope, input }) => updateNotificationSettings({ scope, input }),
});
