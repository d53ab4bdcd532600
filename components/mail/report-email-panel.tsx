'use client';

import { useState, useTransition, type FormEvent } from 'react';
import useSWR from 'swr';
import { OutboxStatusList } from '@/components/mail/outbox-status';
import { Field, FormMessage, TextInput } from '@/components/ui/field';
import { fetcher } from '@/lib/swr/fetcher';
import type { ActionResult } from '@/lib/validations/api';
import { MAX_RECIPIENTS, reportEmailSchema, type OutboxMessageOut, type ReportEmailPreview } from '@/lib/validations/mail';

type Queued = { message: OutboxMessageOut; created: boolean };
type Act = (input: unknown) => Promise<ActionResult<Queued>>;

function newKey(): string {
  return crypto.randomUUID();
}

/**
 * E-mailing the report: a preview of the message first (recipients, subject, message, the PDF
 * attached), then one send per click — the form's idempotency key is made when the preview opens
 * and kept until the send lands, so a double tap or a retried request queues one message.
 */
export function ReportEmailPanel({
  callId,
  initial,
  sendReport,
  resend,
}: {
  callId: string;
  initial: ReportEmailPreview;
  sendReport: Act;
  resend: Act;
}) {
  const key = `/api/calls/${callId}/report-email`;
  const { data, mutate } = useSWR<ReportEmailPreview>(key, fetcher, {
    fallbackData: initial,
    // While a message waits for the mail server, its status is fetched again every few seconds.
    refreshInterval: (latest) => (latest?.messages.some((m) => m.status === 'queued' || m.status === 'sending') ? 3000 : 0),
  });
  const preview = data ?? initial;
  const [open, setOpen] = useState(false);
  const [to, setTo] = useState<string[]>(initial.to);
  const [subject, setSubject] = useState(initial.subject);
  const [body, setBody] = useState(initial.body);
  const [idempotencyKey, setIdempotencyKey] = useState<string>('');
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ text: string; tone: 'error' | 'ok' } | null>(null);
  const [pending, startTransition] = useTransition();

  function openPreview() {
    setTo(preview.to);
    setSubject(preview.subject);
    setBody(preview.body);
    setIdempotencyKey(newKey());
    setErrors({});
    setMessage(null);
    setOpen(true);
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    const email = { to: to.map((t) => t.trim()).filter(Boolean), subject, body, idempotencyKey };
    const parsed = reportEmailSchema.safeParse(email);
    if (!parsed.success) {
      const fe: Record<string, string[]> = {};
      for (const issue of parsed.error.issues) (fe[String(issue.path[0] ?? '_form')] ??= []).push(issue.message);
      setErrors(fe);
      setMessage({ text: parsed.error.issues[0]?.message ?? 'Check the form.', tone: 'error' });
      return;
    }
    setErrors({});
    startTransition(async () => {
      const result = await sendReport({ id: callId, email: parsed.data });
      if (!result.ok) {
        setErrors(result.fieldErrors ?? {});
        setMessage({ text: result.message, tone: 'error' });
        return;
      }
      setOpen(false);
      setMessage({
        text: result.data.created
          ? `Queued for ${result.data.message.recipients.join(', ')}. It is sent in a moment; the status is below.`
          : 'That e-mail was already queued; it was not sent twice.',
        tone: 'ok',
      });
      await mutate();
    });
  }

  function resendOne(id: string) {
    startTransition(async () => {
      const result = await resend({ id, idempotencyKey: newKey() });
      setMessage(result.ok ? { text: 'Queued again.', tone: 'ok' } : { text: result.message, tone: 'error' });
      await mutate();
    });
  }

  const toError = errors.to?.[0];
  return (
    <section aria-labelledby="report-email-heading" className="card no-print space-y-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id="report-email-heading" className="text-xl font-bold">
            E-mail the report
          </h2>
          <p className="text-muted">The customer copy goes as a PDF to the site&rsquo;s contact and the office.</p>
        </div>
        {!open && (
          <button type="button" className="btn-primary" onClick={openPreview}>
            Preview the e-mail
          </button>
        )}
      </div>
      {!preview.customerEmail && (
        <p>
          <span aria-hidden>⚠ </span>This site has no customer e-mail address: add one below, or record it on the site.
        </p>
      )}
      {open && (
        <form onSubmit={submit} noValidate aria-label="E-mail preview" className="space-y-4 rounded-lg border border-line bg-surface p-4">
          <fieldset className="space-y-2">
            <legend className="label">To</legend>
            {to.map((address, i) => (
              <div key={i} className="flex gap-2">
                <TextInput
                  type="email"
                  inputMode="email"
                  autoComplete="off"
                  aria-label={`Recipient ${i + 1}`}
                  aria-invalid={Boolean(toError)}
                  value={address}
                  onChange={(e) => setTo(to.map((t, k) => (k === i ? e.target.value : t)))}
                />
                <button type="button" className="btn-secondary" onClick={() => setTo(to.filter((_, k) => k !== i))}>
                  Remove<span className="sr-only"> recipient {i + 1}</span>
                </button>
              </div>
            ))}
            {to.length < MAX_RECIPIENTS && (
              <button type="button" className="btn-secondary" onClick={() => setTo([...to, ''])}>
                Add a recipient
              </button>
            )}
            <p className="field-error" aria-live="polite">
              {toError && (
                <>
                  <span aria-hidden>⚠</span> {toError}
                </>
              )}
            </p>
          </fieldset>
          <Field label="Subject" error={errors.subject?.[0]}>
            {(p) => <TextInput {...p} value={subject} onChange={(e) => setSubject(e.target.value)} maxLength={200} />}
          </Field>
          <Field label="Message" error={errors.body?.[0]}>
            {(p) => <textarea {...p} className="input min-h-40 py-2" value={body} onChange={(e) => setBody(e.target.value)} rows={10} />}
          </Field>
          <p>
            <span className="label">Attached</span>
            <a
              href={`/api/calls/${callId}/report.pdf`}
              target="_blank"
              rel="noreferrer"
              className="inline-flex min-h-touch items-center font-semibold underline"
            >
              {preview.attachmentName}
            </a>
            <span className="block text-sm text-muted">The customer copy of the report, as it stands when you send.</span>
          </p>
          <div className="flex flex-wrap gap-2">
            <button type="submit" className="btn-primary" disabled={pending}>
              {pending ? 'Sending…' : 'Send the report'}
            </button>
            <button type="button" className="btn-secondary" disabled={pending} onClick={() => setOpen(false)}>
              Cancel
            </button>
          </div>
        </form>
      )}
      <FormMessage message={message?.text} tone={message?.tone ?? 'error'} />
      <OutboxStatusList messages={preview.messages} onResend={resendOne} pending={pending} />
    </section>
  );
}
