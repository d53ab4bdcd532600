import { z } from 'zod';
import { emailAddress, multiLine, objectError, singleLine } from '@/lib/validations/text';

// E-mail: the report's send form (shared by the form and the server), the outbox status the call
// shows, the dev mailbox and the notification settings.

export const MAX_RECIPIENTS = 5;

const idempotencyKey = z.uuid({ error: 'The request needs an idempotency key (a UUID made when the form opened).' });

export const reportEmailSchema = z.object(
  {
    to: z
      .array(emailAddress({ label: 'A recipient', required: 'Enter an e-mail address.', invalid: 'That is not a valid e-mail address.' }), {
        error: 'Recipients are a list of e-mail addresses.',
      })
      .refine((a) => a.length >= 1, { error: 'Add at least one recipient.', abort: true })
      .refine((a) => a.length <= MAX_RECIPIENTS, { error: `At most ${MAX_RECIPIENTS} recipients.`, abort: true })
      .refine((a) => new Set(a).size === a.length, { error: 'Each recipient once.' }),
    subject: singleLine({ label: 'The subject', max: 200, required: 'Enter a subject.' }),
    body: multiLine({ label: 'The message', max: 5000, required: 'Write a short message.' }),
    idempotencyKey,
  },
  { error: objectError('the e-mail') },
);
export type ReportEmailInput = z.infer<typeof reportEmailSchema>;

export const resendSchema = z.object({ idempotencyKey }, { error: objectError('the resend') });

export const NOTIFICATION_KINDS = ['sign-off', 'escalation', 'tree-review', 'scenario'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];
export const NOTIFICATION_LABELS: Record<NotificationKind, { title: string; detail: string }> = {
  'sign-off': { title: 'Findings waiting for my sign-off', detail: 'An apprentice reached a finding that a technician signs off.' },
  escalation: { title: 'Escalated diagnoses', detail: 'Someone at a unit found that no step fits and handed the diagnosis to the leads.' },
  'tree-review': { title: 'Fault-tree versions to review', detail: 'Another lead asked for a review of a draft.' },
  scenario: { title: 'Practice scenarios assigned to me', detail: 'A trainer assigned a scenario on the bench.' },
};

export const notificationSettingsSchema = z.object(
  Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, z.boolean({ error: `${k} is on (true) or off (false).` }).optional()])) as Record<
    NotificationKind,
    z.ZodOptional<z.ZodBoolean>
  >,
  { error: objectError('the notification settings') },
);

// ── Output ──────────────────────────────────────────────────────────────────────────────────────

const isoDate = z.union([z.date(), z.string()]).transform((d) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString()));

export const outboxMessageSchema = z.object({
  id: z.string(),
  kind: z.enum(['report', 'sign-off', 'escalation', 'tree-review', 'scenario']),
  recipients: z.array(z.string()),
  subject: z.string(),
  attachmentName: z.string().nullable(),
  status: z.enum(['queued', 'sending', 'sent', 'failed']),
  attempts: z.number(),
  maxAttempts: z.number(),
  nextAttemptAt: isoDate,
  lastError: z.string().nullable(),
  sentAt: isoDate.nullable(),
  createdByName: z.string().nullable(),
  createdAt: isoDate,
});
export type OutboxMessageOut = z.output<typeof outboxMessageSchema>;

export const queuedMailSchema = z.object({ message: outboxMessageSchema, created: z.boolean() });

export const reportEmailPreviewSchema = z.object({
  subject: z.string(),
  to: z.array(z.string()),
  body: z.string(),
  attachmentName: z.string(),
  customerEmail: z.string().nullable(),
  officeEmail: z.string().nullable(),
  messages: z.array(outboxMessageSchema),
});
export type ReportEmailPreview = z.output<typeof reportEmailPreviewSchema>;

export const mailboxSchema = z.object({
  enabled: z.boolean(),
  messages: z.array(
    z.object({
      name: z.string(),
      subject: z.string(),
      from: z.string(),
      to: z.string(),
      date: z.string().nullable(),
      size: z.number(),
      text: z.string(),
      attachments: z.array(z.object({ index: z.number(), filename: z.string(), contentType: z.string(), size: z.number() })),
    }),
  ),
});
export type MailboxOut = z.output<typeof mailboxSchema>;

export const notificationSettingsOutSchema = z.object({
  settings: z.array(z.object({ kind: z.enum(NOTIFICATION_KINDS), enabled: z.boolean() })),
  email: z.string(),
});
