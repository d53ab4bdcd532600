// The outbox worker: every few seconds (and at once when woken after a message is queued) it
// claims the due messages, sends each and records the result. A failed send is retried with
// exponential backoff until its attempts are spent; then it is marked failed with the reason, and
// the call page offers a resend. The store and the sender are passed in, so this loop runs the
// same against the database and SMTP in the app and against fakes in a test.

export interface Delivery {
  id: string;
  attempts: number;
  recipients: string[];
  subject: string;
  body: string;
  attachmentName: string | null;
  attachment: Buffer | null;
}

export interface OutboxStore {
  claim(): Promise<Delivery[]>;
  sent(id: string, messageId: string | null): Promise<void>;
  failed(id: string, error: string, retryInMs: number): Promise<unknown>;
}

export type Sender = (d: Delivery) => Promise<string | null>;

/** The wait before attempt `attempt + 1`: base × 2^(attempt − 1), at most `maxMs`. */
export function retryDelayMs(attempt: number, baseMs: number, maxMs = 60 * 60 * 1000): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempt - 1));
}

/** The reason a send failed, in a line the call page can show. */
export function failureReason(error: unknown): string {
  const e = error as { code?: string; responseCode?: number; response?: string; message?: string };
  if (e?.code === 'ECONNREFUSED' || /ECONNREFUSED/.test(e?.message ?? ''))
    return 'The mail server refused the connection (it may be down).';
  if (e?.code === 'ETIMEDOUT' || e?.code === 'ETIMEOUT') return 'The mail server did not answer in time.';
  if (e?.code === 'EENVELOPE') return `The mail server refused a recipient: ${e.response ?? e.message ?? ''}`.trim();
  if (e?.responseCode) return `The mail server answered ${e.responseCode}: ${e.response ?? e.message ?? ''}`.trim();
  return e?.message ? `Sending failed: ${e.message}` : 'Sending failed.';
}

export interface WorkerOptions {
  store: OutboxStore;
  send: Sender;
  intervalMs?: number;
  retryBaseMs?: number;
  log?: (message: string) => void;
}

export function createOutboxWorker({ store, send, intervalMs = 5000, retryBaseMs = 30_000, log = () => {} }: WorkerOptions) {
  let timer: ReturnType<typeof setInterval> | null = null;
  let running: Promise<number> | null = null;
  let again = false;

  /** One pass: sends what is due; answers how many were sent. Passes never overlap. */
  async function runOnce(): Promise<number> {
    if (running) {
      again = true;
      return running;
    }
    running = (async () => {
      let sent = 0;
      do {
        again = false;
        const due = await store.claim();
        let round = 0;
        for (const d of due) {
          try {
            const messageId = await send(d);
            await store.sent(d.id, messageId);
            sent++;
            round++;
          } catch (error) {
            const reason = failureReason(error);
            // Once per message: the call page shows every later attempt, and a long outage would flood the log.
            if (d.attempts === 1) log(`outbox: ${d.id} not sent, retrying with backoff: ${reason}`);
            await store.failed(d.id, reason, retryDelayMs(d.attempts, retryBaseMs));
          }
        }
        // More may be due behind a full batch; a round of failures waits for the next tick.
        if (round > 0) again = true;
      } while (again);
      return sent;
    })();
    try {
      return await running;
    } finally {
      running = null;
    }
  }

  const tick = () => {
    runOnce().catch((error) => log(`outbox: pass failed: ${(error as Error)?.message ?? error}`));
  };

  return {
    runOnce,
    /** Runs a pass soon (after a message was queued), without waiting for it. */
    wake: tick,
    start() {
      if (timer) return;
      timer = setInterval(tick, intervalMs);
      timer.unref?.();
      tick();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await running;
    },
    get started() {
      return timer !== null;
    },
  };
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;
