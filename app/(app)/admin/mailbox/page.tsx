import type { Metadata } from 'next';
import { pageScope } from '@/lib/server/operation';
import { readMailbox } from '@/lib/server/outbox';
import { mailboxSchema } from '@/lib/validations/mail';

export const metadata: Metadata = { title: 'Dev mailbox' };
export const dynamic = 'force-dynamic';

function kilobytes(n: number): string {
  return n < 1024 ? `${n} B` : `${(n / 1024).toFixed(n < 10 * 1024 ? 1 : 0)} kB`;
}

export default async function MailboxPage() {
  await pageScope('mail.mailbox');
  const mailbox = mailboxSchema.parse(await readMailbox());
  return (
    <div className="space-y-6">
      <div className="space-y-1">
        <h1 className="page-title">Dev mailbox</h1>
        <p className="text-muted">
          What the local SMTP sink caught: every e-mail the app sent while it runs against the sink (npm start, npm test). Nothing here
          reached anyone.
        </p>
      </div>
      {!mailbox.enabled ? (
        <p className="card">
          No local mail sink is configured (MAIL_SINK_DIR is not set): e-mail goes to the real mail server, and its copies are not kept
          here.
        </p>
      ) : mailbox.messages.length === 0 ? (
        <p className="card">No e-mail caught yet. Send a report from a call and it shows here within a few seconds.</p>
      ) : (
        <ol className="space-y-3" aria-label="Caught e-mails, newest first">
          {mailbox.messages.map((m) => (
            <li key={m.name} className="card">
              <details>
                <summary className="flex min-h-touch cursor-pointer flex-wrap items-center gap-x-3 gap-y-1">
                  <span className="font-semibold">{m.subject || '(no subject)'}</span>
                  <span className="text-sm text-muted">to {m.to}</span>
                  {m.attachments.length > 0 && (
                    <span className="text-sm">
                      <span aria-hidden>⊕ </span>
                      {m.attachments.length} {m.attachments.length === 1 ? 'attachment' : 'attachments'}
                    </span>
                  )}
                </summary>
                <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
                  <dt className="text-muted">From</dt>
                  <dd>{m.from}</dd>
                  <dt className="text-muted">To</dt>
                  <dd className="break-words">{m.to}</dd>
                  <dt className="text-muted">Date</dt>
                  <dd>{m.date ?? '—'}</dd>
                  <dt className="text-muted">Size</dt>
                  <dd>{kilobytes(m.size)}</dd>
                </dl>
                {m.attachments.length > 0 && (
                  <ul className="mt-3 flex flex-wrap gap-2" aria-label="Attachments">
                    {m.attachments.map((a) => (
                      <li key={a.index}>
                        <a
                          className="btn-secondary"
                          href={`/api/dev/mailbox/${encodeURIComponent(m.name)}/${a.index}`}
                          target="_blank"
                          rel="noreferrer"
                        >
                          {a.filename} ({a.contentType}, {kilobytes(a.size)})
                        </a>
                      </li>
                    ))}
                  </ul>
                )}
                <pre className="mt-3 whitespace-pre-wrap break-words rounded-lg border border-line bg-surface p-3 font-sans text-base">
                  {m.text || '(no text part)'}
                </pre>
              </details>
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
