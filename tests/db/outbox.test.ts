// @vitest-environment node
import { randomUUID } from 'node:crypto';
import {
  claimDueMessages,
  enqueueMessage,
  getMessage,
  listMessagesForCall,
  listNotifiable,
  markAttemptFailed,
  markSent,
  saveNotificationSettings,
} from '@/db/outbox';
import { db } from '@/db/knex';
import { parseEml } from '@/lib/mail/eml';
import { createMailTransport, mailConfig, sendMail } from '@/lib/mail/transport';
import { createOutboxWorker } from '@/lib/mail/worker';
import { startSink, type Sink } from '../support/smtp-sink';

// The outbox against the real PostgreSQL, and the worker over it sending to a real SMTP sink on
// loopback: one send per idempotency key, no row claimed twice, a server that is down and comes
// back, and exactly one delivery in the end.

const tag = randomUUID().slice(0, 8);
let companyId: string;
let userIds: { tech: string; lead: string; lead2: string };
let sink: Sink;

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
  const [company] = await db('companies')
    .insert({ name: `Outbox Co ${tag}`, office_email: `office-${tag}@outbox.test` })
    .returning('id');
  companyId = company.id;
  const user = async (role: string, name: string) =>
    (
      await db('users')
        .insert({ company_id: companyId, email: `${name}-${tag}@outbox.test`, name, role, password_hash: 'x' })
        .returning('id')
    )[0].id as string;
  userIds = { tech: await user('technician', 'Tech'), lead: await user('lead', 'Lead'), lead2: await user('lead', 'Lead Two') };
  sink = await startSink();
});

afterAll(async () => {
  await sink?.stop();
  await db('companies').where({ id: companyId }).delete();
  await db.destroy();
});

const queue = (key: string, extra: Partial<Parameters<typeof enqueueMessage>[0]> = {}) =>
  enqueueMessage({
    companyId,
    kind: 'report',
    idempotencyKey: `${tag}:${key}`,
    recipients: ['customer@outbox.test'],
    subject: `Report ${key}`,
    body: 'Attached.',
    attachment: { name: 'report.pdf', content: Buffer.from('%PDF-1.3 test') },
    ...extra,
  });

/** Only this file's rows: other test files share the database and its outbox. */
const ours = async (ids: string[]) =>
  (await db('outbox').whereIn('id', ids).select('id', 'status', 'attempts', 'last_error')) as {
    id: string;
    status: string;
    attempts: number;
    last_error: string | null;
  }[];

function worker() {
  const config = { ...mailConfig({}), host: '127.0.0.1', port: sink.port, from: 'Proving Ground <no-reply@outbox.test>' };
  const transport = createMailTransport(config);
  return createOutboxWorker({
    // Claim only this company's rows, so the test never sends another file's messages.
    store: {
      claim: async () => (await claimDueMessages({ limit: 20 })).filter((d) => d.companyId === companyId),
      sent: (id, messageId) => markSent({ id, messageId }),
      failed: (id, error) => markAttemptFailed({ id, error, retryInMs: 0 }),
    },
    send: (d) =>
      sendMail(transport, config.from, {
        id: d.id,
        to: d.recipients,
        subject: d.subject,
        text: d.body,
        attachment: d.attachment ? { name: d.attachmentName!, content: d.attachment, contentType: 'application/pdf' } : null,
      }),
  });
}

describe('enqueueMessage', () => {
  it('queues once per idempotency key', async () => {
    const [a, b] = await Promise.all([queue('once'), queue('once')]);
    expect(a.message.id).toBe(b.message.id);
    expect([a.created, b.created].sort()).toEqual([false, true]);
    expect(
      await db('outbox')
        .where({ company_id: companyId, idempotency_key: `${tag}:once` })
        .count('* as n'),
    ).toEqual([{ n: '1' }]);
    const again = await queue('once', { subject: 'Something else' });
    expect(again.created).toBe(false);
    expect(again.message.subject).toBe('Report once');
    await db('outbox').where({ id: a.message.id }).delete();
  });

  it('keeps the key per company: another company may use the same one', async () => {
    const [other] = await db('companies')
      .insert({ name: `Other ${tag}`, office_email: `o-${tag}@outbox.test` })
      .returning('id');
    try {
      const mine = await queue('shared');
      const theirs = await enqueueMessage({
        companyId: other.id,
        kind: 'report',
        idempotencyKey: `${tag}:shared`,
        recipients: ['x@outbox.test'],
        subject: 'Theirs',
        body: 'x',
      });
      expect(theirs.created).toBe(true);
      expect(theirs.message.id).not.toBe(mine.message.id);
      expect(await getMessage({ companyId: other.id, id: mine.message.id })).toBeNull();
      await db('outbox').where({ id: mine.message.id }).delete();
    } finally {
      await db('companies').where({ id: other.id }).delete();
    }
  });
});

describe('claimDueMessages', () => {
  it('never hands one row to two passes at once', async () => {
    const made = await Promise.all(Array.from({ length: 6 }, (_, i) => queue(`claim-${i}`)));
    const ids = made.map((m) => m.message.id);
    const [x, y] = await Promise.all([claimDueMessages({ limit: 50 }), claimDueMessages({ limit: 50 })]);
    const mineX = x.filter((d) => ids.includes(d.id)).map((d) => d.id);
    const mineY = y.filter((d) => ids.includes(d.id)).map((d) => d.id);
    expect(mineX.filter((id) => mineY.includes(id))).toEqual([]);
    expect([...mineX, ...mineY].sort()).toEqual([...ids].sort());
    expect((await ours(ids)).every((r) => r.status === 'sending' && r.attempts === 1)).toBe(true);
    // Put back whatever other files' rows were taken along.
    await db('outbox')
      .whereIn(
        'id',
        [...x, ...y].map((d) => d.id).filter((id) => !ids.includes(id)),
      )
      .update({ status: 'queued', locked_until: null });
    await db('outbox').whereIn('id', ids).delete();
  });

  it('takes a row back once its lease ran out (a pass that died mid-send)', async () => {
    const { message } = await queue('lease');
    const first = (await claimDueMessages({ limit: 50, leaseSeconds: 0 })).filter((d) => d.id === message.id);
    expect(first).toHaveLength(1);
    const again = (await claimDueMessages({ limit: 50 })).filter((d) => d.id === message.id);
    expect(again).toHaveLength(1);
    expect(again[0].attempts).toBe(2);
    await db('outbox').where({ id: message.id }).delete();
  });
});

describe('the worker over the outbox and SMTP', () => {
  it('delivers a message with its PDF and records it as sent', async () => {
    sink.messages.length = 0;
    const { message } = await queue('deliver');
    await worker().runOnce();
    const [row] = await ours([message.id]);
    expect(row.status).toBe('sent');
    const delivered = sink.messages.map(parseEml).filter((m) => m.headers['x-outbox-id'] === message.id);
    expect(delivered).toHaveLength(1);
    expect(delivered[0].attachments[0].filename).toBe('report.pdf');
    expect(delivered[0].attachments[0].content.toString()).toBe('%PDF-1.3 test');
    const stored = await getMessage({ companyId, id: message.id });
    expect(stored?.sentAt).toBeInstanceOf(Date);
    expect(stored?.messageId).toBe(`<${message.id}@proving-ground.outbox>`);
  });

  it('retries after the mail server was down and delivers exactly once', async () => {
    sink.messages.length = 0;
    const { message } = await queue('down');
    const w = worker();
    await sink.stop();
    try {
      await w.runOnce();
      let [row] = await ours([message.id]);
      expect(row).toMatchObject({ status: 'queued', attempts: 1 });
      expect(row.last_error).toMatch(/refused the connection/);
      await w.runOnce();
      [row] = await ours([message.id]);
      expect(row).toMatchObject({ status: 'queued', attempts: 2 });
    } finally {
      await sink.start();
    }
    await w.runOnce();
    await w.runOnce();
    const [row] = await ours([message.id]);
    expect(row).toMatchObject({ status: 'sent', attempts: 3, last_error: null });
    expect(sink.messages.map(parseEml).filter((m) => m.headers['x-outbox-id'] === message.id)).toHaveLength(1);
  });

  it('marks a message failed with the reason once its attempts are spent', async () => {
    const { message } = await queue('spent');
    await db('outbox').where({ id: message.id }).update({ max_attempts: 2 });
    const w = worker();
    await sink.stop();
    try {
      await w.runOnce();
      await w.runOnce();
      await w.runOnce();
    } finally {
      await sink.start();
    }
    const [row] = await ours([message.id]);
    expect(row).toMatchObject({ status: 'failed', attempts: 2 });
    expect(row.last_error).toMatch(/refused the connection/);
  });

  it('lists a call’s messages newest first', async () => {
    const [siteRow] = await db('sites').insert({ company_id: companyId, name: 'S', address: 'A' }).returning('id');
    const [unitRow] = await db('units')
      .insert({
        company_id: companyId,
        site_id: siteRow.id,
        label: 'U',
        ignition: 'two-rod',
        fuel: 'natural-gas',
        control_supply: '24v',
        transformer_va: 40,
      })
      .returning('id');
    const [call] = await db('service_calls').insert({ company_id: companyId, unit_id: unitRow.id, complaint: 'No heat' }).returning('id');
    const a = await queue('call-a', { callId: call.id });
    const b = await queue('call-b', { callId: call.id });
    const list = await listMessagesForCall({ companyId, callId: call.id });
    expect(list.map((m) => m.id)).toEqual([b.message.id, a.message.id]);
  });
});

describe('notification settings', () => {
  it('leaves out whoever turned the kind off, and the actor', async () => {
    const leads = async () => (await listNotifiable({ companyId, kind: 'escalation', roles: ['lead'] })).map((u) => u.name);
    expect(await leads()).toEqual(['Lead', 'Lead Two']);
    await saveNotificationSettings({ companyId, userId: userIds.lead2, settings: { escalation: false } });
    expect(await leads()).toEqual(['Lead']);
    expect((await listNotifiable({ companyId, kind: 'tree-review', roles: ['lead'], except: userIds.lead })).map((u) => u.name)).toEqual([
      'Lead Two',
    ]);
    await saveNotificationSettings({ companyId, userId: userIds.lead2, settings: { escalation: true } });
    expect(await leads()).toEqual(['Lead', 'Lead Two']);
  });
});
