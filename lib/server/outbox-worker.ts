import 'server-only';
import type { Knex } from 'knex';
import { claimDueMessages, enqueueMessage, markAttemptFailed, markSent, type EnqueueInput } from '@/db/outbox';
import { createMailTransport, mailConfig, sendMail } from '@/lib/mail/transport';
import { createOutboxWorker, type OutboxWorker } from '@/lib/mail/worker';

// The app's one outbox worker, started by instrumentation.ts when the server starts, kept on
// globalThis so that a dev reload does not start a second one. Everything that sends mail goes
// through `queueMail`: the row is written first, then the worker is woken.

const globalForOutbox = globalThis as unknown as { provingGroundOutbox?: OutboxWorker };

function numberFromEnv(name: string, fallback: number): number {
  const n = Number(process.env[name]);
  return Number.isFinite(n) && n >= 0 ? n : fallback;
}

export function outboxWorker(): OutboxWorker {
  if (!globalForOutbox.provingGroundOutbox) {
    const config = mailConfig();
    const transport = createMailTransport(config);
    globalForOutbox.provingGroundOutbox = createOutboxWorker({
      store: {
        claim: () => claimDueMessages({ limit: 5 }),
        sent: (id, messageId) => markSent({ id, messageId }),
        failed: (id, error, retryInMs) => markAttemptFailed({ id, error, retryInMs }),
      },
      send: (d) =>
        sendMail(transport, config.from, {
          id: d.id,
          to: d.recipients,
          subject: d.subject,
          text: d.body,
          attachment:
            d.attachment && d.attachmentName ? { name: d.attachmentName, content: d.attachment, contentType: 'application/pdf' } : null,
        }),
      intervalMs: numberFromEnv('MAIL_WORKER_INTERVAL_MS', 5000),
      retryBaseMs: numberFromEnv('MAIL_RETRY_BASE_MS', 30_000),
      log: (message) => console.warn(message),
    });
  }
  return globalForOutbox.provingGroundOutbox;
}

export function startOutboxWorker(): void {
  if (process.env.OUTBOX_WORKER === 'off') return;
  outboxWorker().start();
}

/** Queues a message (once per idempotency key) and wakes the worker once the caller's transaction is done. */
export async function queueMail(input: EnqueueInput, trx?: Knex) {
  const result = await enqueueMessage(input, trx);
  if (!trx && outboxWorker().started) outboxWorker().wake();
  return result;
}

/** Wakes the worker after a transaction that queued mail has committed. */
export function wakeOutbox(): void {
  if (outboxWorker().started) outboxWorker().wake();
}
