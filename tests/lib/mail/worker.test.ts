// @vitest-environment node
import { Buffer } from 'node:buffer';
import { parseEml } from '@/lib/mail/eml';
import { createMailTransport, mailConfig, sendMail } from '@/lib/mail/transport';
import { createOutboxWorker, failureReason, retryDelayMs, type Delivery, type OutboxStore } from '@/lib/mail/worker';
import { startSink, type Sink } from '../../support/smtp-sink';

// The worker's loop with an outbox kept in memory and a real SMTP conversation (nodemailer to
// smtp-server on loopback): delivery with the attachment, and a mail server that is down.

interface Row extends Delivery {
  status: 'queued' | 'sending' | 'sent' | 'failed';
  dueAt: number;
  lastError: string | null;
  maxAttempts: number;
}

function memoryStore(rows: Row[], now: () => number): OutboxStore {
  return {
    async claim() {
      const due = rows.filter((r) => r.status === 'queued' && r.dueAt <= now());
      for (const r of due) {
        r.status = 'sending';
        r.attempts++;
      }
      return due.map((r) => ({ ...r }));
    },
    async sent(id) {
      rows.find((r) => r.id === id)!.status = 'sent';
    },
    async failed(id, error, retryInMs) {
      const r = rows.find((x) => x.id === id)!;
      r.lastError = error;
      r.status = r.attempts >= r.maxAttempts ? 'failed' : 'queued';
      r.dueAt = now() + retryInMs;
    },
  };
}

const pdf = Buffer.from('%PDF-1.3\nnot a real report, but bytes to carry\n%%EOF\n');
const row = (id: string): Row => ({
  id,
  attempts: 0,
  recipients: ['customer@demo.test', 'office@demo.test'],
  subject: 'Service report: Lindqvist residence',
  body: 'Attached is the report.',
  attachmentName: 'service-report.pdf',
  attachment: pdf,
  status: 'queued',
  dueAt: 0,
  lastError: null,
  maxAttempts: 4,
});

let sink: Sink;
beforeAll(async () => {
  sink = await startSink();
});
afterAll(async () => {
  await sink.stop();
});
beforeEach(() => {
  sink.messages.length = 0;
});

function worker(rows: Row[], clock: { t: number }) {
  const config = { ...mailConfig({}), port: sink.port, from: 'Proving Ground <no-reply@demo.test>' };
  const transport = createMailTransport({ ...config, host: '127.0.0.1' });
  return createOutboxWorker({
    store: memoryStore(rows, () => clock.t),
    send: (d) =>
      sendMail(transport, config.from, {
        id: d.id,
        to: d.recipients,
        subject: d.subject,
        text: d.body,
        attachment: d.attachment ? { name: d.attachmentName!, content: d.attachment, contentType: 'application/pdf' } : null,
      }),
    retryBaseMs: 1000,
  });
}

describe('outbox worker', () => {
  it('delivers a queued message to the SMTP server with its PDF attached', async () => {
    const rows = [row('a1')];
    const sent = await worker(rows, { t: 0 }).runOnce();
    expect(sent).toBe(1);
    expect(rows[0].status).toBe('sent');
    expect(sink.messages).toHaveLength(1);
    const eml = parseEml(sink.messages[0]);
    expect(eml.subject).toBe('Service report: Lindqvist residence');
    expect(eml.to).toBe('customer@demo.test, office@demo.test');
    expect(eml.headers['message-id']).toBe('<a1@proving-ground.outbox>');
    expect(eml.attachments.map((a) => [a.filename, a.contentType])).toEqual([['service-report.pdf', 'application/pdf']]);
    expect(eml.attachments[0].content.toString('hex')).toBe(pdf.toString('hex'));
  });

  it('retries with backoff while the server is down and delivers exactly once when it is back', async () => {
    const rows = [row('b1')];
    const clock = { t: 0 };
    const w = worker(rows, clock);
    await sink.stop();
    try {
      expect(await w.runOnce()).toBe(0);
      expect(rows[0]).toMatchObject({ status: 'queued', attempts: 1, dueAt: 1000 });
      expect(rows[0].lastError).toMatch(/refused the connection/);
      // Not due yet: nothing is tried.
      expect(await w.runOnce()).toBe(0);
      expect(rows[0].attempts).toBe(1);
      clock.t = 1000;
      expect(await w.runOnce()).toBe(0);
      expect(rows[0]).toMatchObject({ status: 'queued', attempts: 2, dueAt: 3000 });
    } finally {
      await sink.start();
    }
    clock.t = 3000;
    expect(await w.runOnce()).toBe(1);
    expect(rows[0].status).toBe('sent');
    clock.t = 1e9;
    expect(await w.runOnce()).toBe(0);
    expect(sink.messages.filter((m) => parseEml(m).headers['x-outbox-id'] === 'b1')).toHaveLength(1);
  });

  it('gives up after the last attempt and keeps the reason', async () => {
    const rows = [{ ...row('c1'), maxAttempts: 2 }];
    const clock = { t: 0 };
    const w = worker(rows, clock);
    await sink.stop();
    try {
      await w.runOnce();
      clock.t = 10_000;
      await w.runOnce();
    } finally {
      await sink.start();
    }
    expect(rows[0].status).toBe('failed');
    expect(rows[0].attempts).toBe(2);
    expect(rows[0].lastError).toMatch(/refused the connection/);
    clock.t = 1e9;
    expect(await w.runOnce()).toBe(0);
    expect(sink.messages).toHaveLength(0);
  });

  it('runs one pass at a time: a second call while one runs sends nothing twice', async () => {
    const rows = [row('d1'), row('d2'), row('d3')];
    const w = worker(rows, { t: 0 });
    const [first, second] = await Promise.all([w.runOnce(), w.runOnce()]);
    expect(first).toBe(3);
    expect(second).toBe(3);
    expect(sink.messages).toHaveLength(3);
  });
});

describe('retryDelayMs and failureReason', () => {
  it('doubles from the base up to the cap', () => {
    expect([1, 2, 3, 4].map((a) => retryDelayMs(a, 30_000))).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(30, 30_000)).toBe(60 * 60 * 1000);
  });
  it('says why in words', () => {
    expect(failureReason({ code: 'ECONNREFUSED' })).toMatch(/refused the connection/);
    expect(failureReason({ responseCode: 550, response: '550 No such user' })).toBe('The mail server answered 550: 550 No such user');
  });
});
