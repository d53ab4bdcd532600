import 'server-only';
import { readdir, readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { getCall } from '@/db/calls';
import { getAttachment, getMessage, listMessagesForCall } from '@/db/outbox';
import { AppError } from '@/lib/errors';
import { parseEml } from '@/lib/mail/eml';
import { composeReportEmail } from '@/lib/mail/report-email';
import { renderReportPdf } from '@/lib/pdf/render';
import { reportFileName } from '@/lib/pdf/report-model';
import type { Scope } from '@/lib/policy';
import { getCallReport } from '@/lib/server/calls';
import { queueMail } from '@/lib/server/outbox-worker';
import { reportPhotos } from '@/lib/server/report-photos';
import { callReportSchema } from '@/lib/validations/api';
import type { ReportEmailInput } from '@/lib/validations/mail';

// ── The report by e-mail ────────────────────────────────────────────────────────────────────────

async function reportOf(scope: Scope, id: string) {
  return callReportSchema.parse(await getCallReport({ scope, id }));
}

/** The report as a PDF, customer copy or office record. */
export async function reportPdf({ scope, id, version }: { scope: Scope; id: string; version: 'customer' | 'office' }) {
  const report = await reportOf(scope, id);
  const photos = await reportPhotos({ scope, callId: id });
  return { filename: reportFileName(report, version), pdf: await renderReportPdf({ report, version, photos }) };
}

/** What the send form starts from: the recipients, subject and message, and the call's earlier e-mails. */
export async function previewReportEmail({ scope, id }: { scope: Scope; id: string }) {
  const report = await reportOf(scope, id);
  const draft = composeReportEmail(report);
  const messages = await listMessagesForCall({ companyId: scope.companyId, callId: id });
  return {
    ...draft,
    attachmentName: reportFileName(report, 'customer'),
    customerEmail: report.site.contactEmail,
    officeEmail: report.company.officeEmail,
    messages,
  };
}

/**
 * Queues the customer copy of the report to the recipients given. The PDF is rendered now, so the
 * message carries the report as it stood when it was sent. The same idempotency key twice queues
 * one message.
 */
export async function sendReportEmail({ scope, id, input }: { scope: Scope; id: string; input: ReportEmailInput }) {
  const report = await reportOf(scope, id);
  const pdf = await renderReportPdf({ report, version: 'customer', photos: await reportPhotos({ scope, callId: id }) });
  return queueMail({
    companyId: scope.companyId,
    callId: id,
    kind: 'report',
    idempotencyKey: `report:${input.idempotencyKey}`,
    recipients: input.to,
    subject: input.subject,
    body: input.body,
    attachment: { name: reportFileName(report, 'customer'), content: pdf },
    createdBy: scope.userId,
  });
}

/** Sends a stored message again as a new one (a failed send, or a customer who lost it). */
export async function resendMessage({ scope, id, idempotencyKey }: { scope: Scope; id: string; idempotencyKey: string }) {
  const message = await getMessage({ companyId: scope.companyId, id });
  // Only messages of a call are resent from its page, by someone who reaches the call.
  if (!message || !message.callId) throw new AppError('not_found', 'That e-mail was not found.');
  await getCall({ scope, id: message.callId });
  if (message.status === 'queued' || message.status === 'sending') {
    throw new AppError('conflict', 'That e-mail is still waiting to be sent; it is retried by itself.');
  }
  const attachment = await getAttachment({ companyId: scope.companyId, id });
  return queueMail({
    companyId: scope.companyId,
    callId: message.callId,
    kind: message.kind,
    idempotencyKey: `resend:${idempotencyKey}`,
    recipients: message.recipients,
    subject: message.subject,
    body: message.body,
    attachment: attachment && message.attachmentName ? { name: message.attachmentName, content: attachment } : null,
    createdBy: scope.userId,
  });
}

// ── The dev mailbox: what the local SMTP sink caught ────────────────────────────────────────────

const MAILBOX_LIMIT = 50;
const EML_NAME = /^[A-Za-z0-9][A-Za-z0-9._-]{0,200}\.eml$/;

// The sink directory comes from the environment at run time: the bundler is told not to trace it.
function sinkDir(): string | null {
  return process.env.MAIL_SINK_DIR || null;
}

/** The newest messages in MAIL_SINK_DIR; `enabled: false` where no local sink is configured (a real mail server). */
export async function readMailbox() {
  const dir = sinkDir();
  if (!dir) return { enabled: false, messages: [] };
  let names: string[];
  try {
    names = (await readdir(/*turbopackIgnore: true*/ dir)).filter((n) => EML_NAME.test(n));
  } catch {
    return { enabled: true, messages: [] };
  }
  const files = await Promise.all(
    names.map(async (name) => {
      const info = await stat(/*turbopackIgnore: true*/ path.join(dir, name)).catch(() => null);
      return info ? { name, mtime: info.mtimeMs, size: info.size } : null;
    }),
  );
  const newest = files
    .filter((f): f is { name: string; mtime: number; size: number } => f !== null)
    .sort((a, b) => b.mtime - a.mtime)
    .slice(0, MAILBOX_LIMIT);
  const messages = [];
  for (const f of newest) {
    const raw = await readFile(/*turbopackIgnore: true*/ path.join(dir, f.name)).catch(() => null);
    if (!raw) continue;
    const eml = parseEml(raw);
    messages.push({
      name: f.name,
      subject: eml.subject,
      from: eml.from,
      to: eml.to,
      date: eml.date,
      size: f.size,
      text: eml.text.slice(0, 20_000),
      attachments: eml.attachments.map((a, index) => ({
        index,
        filename: a.filename ?? `part-${index}`,
        contentType: a.contentType,
        size: a.content.length,
      })),
    });
  }
  return { enabled: true, messages };
}

/** One attachment of a caught message, for download. */
export async function readMailboxAttachment({ name, index }: { name: string; index: number }) {
  const dir = sinkDir();
  if (!dir || !EML_NAME.test(name)) throw new AppError('not_found', 'That message was not found.');
  const raw = await readFile(/*turbopackIgnore: true*/ path.join(dir, name)).catch(() => null);
  if (!raw) throw new AppError('not_found', 'That message was not found.');
  const part = parseEml(raw).attachments[index];
  if (!part) throw new AppError('not_found', 'That attachment was not found.');
  return { filename: part.filename ?? `part-${index}`, contentType: part.contentType, content: part.content };
}
