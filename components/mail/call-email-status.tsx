'use client';

import Link from 'next/link';
import { useState, useTransition } from 'react';
import useSWR from 'swr';
import { OutboxStatusList } from '@/components/mail/outbox-status';
import { FormMessage } from '@/components/ui/field';
import { fetcher } from '@/lib/swr/fetcher';
import type { ActionResult } from '@/lib/validations/api';
import type { OutboxMessageOut, ReportEmailPreview } from '@/lib/validations/mail';

type Act = (input: unknown) => Promise<ActionResult<{ message: OutboxMessageOut; created: boolean }>>;

/**
 * The call page's view of its e-mails: each report e-mail's status (queued, sent, failed with the
 * reason) with a resend, the same list the report page shows and from the same source, refreshed
 * while one is still on its way. Sending a new one starts from the report's preview.
 */
export function CallEmailStatus({ callId, initial, resend }: { callId: string; initial: ReportEmailPreview; resend: Act }) {
  const { data, mutate } = useSWR<ReportEmailPreview>(`/api/calls/${callId}/report-email`, fetcher, {
    fallbackData: initial,
    refreshInterval: (latest) => (latest?.messages.some((m) => m.status === 'queued' || m.status === 'sending') ? 3000 : 0),
  });
  const messages = (data ?? initial).messages;
  const [message, setMessage] = useState<{ text: string; tone: 'error' | 'ok' } | null>(null);
  const [pending, startTransition] = useTransition();

  function resendOne(id: string) {
    startTransition(async () => {
      const result = await resend({ id, idempotencyKey: crypto.randomUUID() });
      setMessage(result.ok ? { text: 'Queued again.', tone: 'ok' } : { text: result.message, tone: 'error' });
      await mutate();
    });
  }

  return (
    <section aria-labelledby="email-heading" className="card space-y-3" data-testid="call-email-status">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <h2 id="email-heading" className="text-xl font-bold">
          E-mail
        </h2>
        <Link href={`/calls/${callId}/report?version=customer`} className="btn-secondary">
          {messages.length > 0 ? 'E-mail the report again' : 'E-mail the report'}
        </Link>
      </div>
      <FormMessage message={message?.text} tone={message?.tone ?? 'error'} />
      <OutboxStatusList messages={messages} onResend={resendOne} pending={pending} />
    </section>
  );
}
