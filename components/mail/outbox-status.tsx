'use client';

import { Time } from '@/components/ui/time-zone';
import type { OutboxMessageOut } from '@/lib/validations/mail';

const STATUS: Record<OutboxMessageOut['status'], { icon: string; word: string }> = {
  queued: { icon: '◷', word: 'Queued' },
  sending: { icon: '↻', word: 'Sending' },
  sent: { icon: '✓', word: 'Sent' },
  failed: { icon: '✗', word: 'Failed' },
};

/** Where each e-mail of a call stands: queued (and why it is waiting), sent, or failed with the reason; resend for the finished ones. */
export function OutboxStatusList({
  messages,
  onResend,
  pending,
}: {
  messages: OutboxMessageOut[];
  onResend?: (id: string) => void;
  pending?: boolean;
}) {
  if (messages.length === 0) return <p className="text-muted">No e-mail sent from this call yet.</p>;
  return (
    <div className="space-y-2">
      <h3 className="font-semibold">E-mails from this call</h3>
      <ul className="space-y-2" aria-label="E-mails from this call">
        {messages.map((m) => {
          const s = STATUS[m.status];
          const retrying = m.status === 'queued' && m.lastError;
          return (
            <li
              key={m.id}
              className="flex flex-wrap items-start justify-between gap-3 rounded-lg border border-line p-3"
              data-status={m.status}
            >
              <div className="min-w-0 space-y-0.5">
                <p className="font-semibold">
                  <span aria-hidden className="font-mono">
                    {s.icon}{' '}
                  </span>
                  {s.word}
                  {m.status === 'sent' && m.sentAt && (
                    <span className="font-normal text-muted">
                      {' '}
                      · <Time value={m.sentAt} />
                    </span>
                  )}
                  {' · '}
                  <span className="font-normal">{m.subject}</span>
                </p>
                <p className="break-words text-sm">To {m.recipients.join(', ')}</p>
                {m.attachmentName && <p className="text-sm text-muted">Attached: {m.attachmentName}</p>}
                {retrying && (
                  <p className="text-sm">
                    Attempt {m.attempts} of {m.maxAttempts} failed: {m.lastError} Retrying by itself at <Time value={m.nextAttemptAt} />.
                  </p>
                )}
                {m.status === 'failed' && (
                  <p className="text-sm font-semibold">
                    <span aria-hidden>⚠ </span>Not sent after {m.attempts} attempts: {m.lastError ?? 'no reason given'}
                  </p>
                )}
                <p className="text-sm text-muted">
                  Queued by {m.createdByName ?? 'someone'}, <Time value={m.createdAt} />
                </p>
              </div>
              {onResend && (m.status === 'sent' || m.status === 'failed') && (
                <button type="button" className="btn-secondary" disabled={pending} onClick={() => onResend(m.id)}>
                  Resend<span className="sr-only"> “{m.subject}”</span>
                </button>
              )}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
