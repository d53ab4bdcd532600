// @vitest-environment node
import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import knexFactory, { type Knex } from 'knex';
import { DEMO, signedIn, type ApiClient, ApiClient as Anonymous } from '../support/http';
import { caught, outboxStatus, useMailSink, waitFor, type MailSink } from '../support/mail';
import { getBytes, verifiedVisit, type Visit } from '../support/visit';

// The report as PDF and by e-mail over HTTP: GET /api/calls/{id}/report.pdf for each version,
// role-checked; the send form's route queueing the customer copy once per idempotency key; the
// outbox worker in the app delivering it to the SMTP sink with the PDF attached, and again after
// the sink was down, exactly once.

const poppler = spawnSync('pdftotext', ['-v']).status === 0;
if (!poppler) console.warn('report.test: poppler-utils not installed; PDF text checks skipped (apt-get install -y poppler-utils).');
const tmp = mkdtempSync(path.join(tmpdir(), 'report-e2e-'));

function pdfText(pdf: Buffer, name: string): { text: string; pages: number } {
  const file = path.join(tmp, name);
  writeFileSync(file, new Uint8Array(pdf));
  const text = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).stdout.replace(/\s+/g, ' ');
  const pages = Number(/^Pages:\s+(\d+)/m.exec(spawnSync('pdfinfo', [file], { encoding: 'utf8' }).stdout)?.[1]);
  return { text, pages };
}

let db: Knex;
let tech: ApiClient;
let admin: ApiClient;
let visit: Visit;
let sink: MailSink;

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  [tech, admin] = await Promise.all([signedIn(DEMO.technician), signedIn(DEMO.admin)]);
  sink = await useMailSink();
  visit = await verifiedVisit(tech);
});

afterAll(async () => {
  await sink?.stop();
  await db?.destroy();
});

describe('GET /api/calls/{id}/report.pdf', () => {
  it('answers the customer copy as a PDF with the readings as typed', async () => {
    const res = await getBytes(tech, `/api/calls/${visit.callId}/report.pdf`);
    expect(res.status).toBe(200);
    expect(res.type).toBe('application/pdf');
    expect(res.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    if (!poppler) return;
    const { text, pages } = pdfText(res.body, 'customer.pdf');
    expect(pages).toBeLessThanOrEqual(2);
    expect(text).toContain('Customer copy');
    expect(text).toContain(visit.siteName);
    expect(text).toContain(visit.findingTitle);
    const flame = visit.readings.filter((r) => r.stepId === 'flame-signal' || r.stepId.includes('recheck--'));
    expect(flame.length).toBeGreaterThanOrEqual(2);
    for (const r of flame) expect(text).toContain(`${r.text} ${r.unit}`);
    expect(text).toContain('Low flame signal');
    expect(text).not.toContain('Lock-out:');
  });

  it('answers the office record with ?version=office: every reading and the lock-out', async () => {
    const res = await getBytes(tech, `/api/calls/${visit.callId}/report.pdf?version=office`);
    expect(res.status).toBe(200);
    if (!poppler) return;
    const { text } = pdfText(res.body, 'office.pdf');
    expect(text).toContain('Office record');
    expect(text).toContain('Lock-out:');
    for (const r of visit.readings) expect(text).toContain(`${r.text} ${r.unit}`);
  });

  it('refuses a version it does not know, a caller without a session, a trainer, and someone else’s call', async () => {
    const bad = await tech.get(`/api/calls/${visit.callId}/report.pdf?version=draft`);
    expect(bad.status).toBe(400);
    expect(bad.json.error.message).toBe('The version is customer or office.');
    expect((await new Anonymous().get(`/api/calls/${visit.callId}/report.pdf`)).status).toBe(401);
    expect((await (await signedIn(DEMO.trainer)).get(`/api/calls/${visit.callId}/report.pdf`)).status).toBe(403);
    expect((await (await signedIn(DEMO.apprentice)).get(`/api/calls/${visit.callId}/report.pdf`)).status).toBe(404);
    expect((await (await signedIn(DEMO.otherAdmin)).get(`/api/calls/${visit.callId}/report.pdf`)).status).toBe(404);
  });
});

describe('the report by e-mail', () => {
  it('previews the customer contact and the office as recipients, a subject and the PDF’s name', async () => {
    const res = await tech.get(`/api/calls/${visit.callId}/report-email`);
    expect(res.status).toBe(200);
    expect(res.json.to).toEqual([visit.customerEmail, 'office@kestrel-valley.demo.test']);
    expect(res.json.subject).toContain(visit.siteName);
    expect(res.json.attachmentName).toMatch(/^service-report-.*\.pdf$/);
  });

  it('refuses bad addresses with a message per field and queues nothing', async () => {
    const before = await db('outbox').where({ call_id: visit.callId }).count('* as n');
    const res = await tech.post(`/api/calls/${visit.callId}/report-email`, {
      to: ['not an address', 'x@demo.test\r\nBcc: y@demo.test'],
      subject: 'Report',
      body: 'x',
      idempotencyKey: randomUUID(),
    });
    expect(res.status).toBe(400);
    expect(res.json.error.fieldErrors.to[0]).toMatch(/valid e-mail address|control characters/);
    expect(await db('outbox').where({ call_id: visit.callId }).count('* as n')).toEqual(before);
  });

  it('queues one message per idempotency key and delivers it to the sink with the PDF attached', async () => {
    const email = {
      to: [visit.customerEmail],
      subject: `Service report ${visit.siteName}`,
      body: 'Attached.',
      idempotencyKey: randomUUID(),
    };
    const first = await tech.post(`/api/calls/${visit.callId}/report-email`, email);
    expect(first.status).toBe(201);
    const again = await tech.post(`/api/calls/${visit.callId}/report-email`, email);
    expect(again.status).toBe(200);
    expect(again.json).toMatchObject({ created: false, message: { id: first.json.message.id } });
    const id = first.json.message.id as string;
    const sent = await waitFor('the e-mail to be sent', async () => {
      const m = await outboxStatus(tech, visit.callId, id);
      return m?.status === 'sent' ? m : null;
    });
    expect(sent.status).toBe('sent');
    if (!sink.dir) return console.warn('MAIL_SINK_DIR not set: the delivered copy is not checked.');
    const copies = await waitFor('the caught copy', async () => caught(sink.dir!, id).length > 0 && caught(sink.dir!, id));
    expect(copies).toHaveLength(1);
    expect(copies[0].to).toBe(visit.customerEmail);
    expect(copies[0].attachments).toHaveLength(1);
    const pdf = copies[0].attachments[0];
    expect(pdf.contentType).toBe('application/pdf');
    expect(pdf.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    if (poppler) expect(pdfText(pdf.content, 'mailed.pdf').text).toContain(visit.findingTitle);
    // The dev mailbox lists it for admins.
    const box = await admin.get('/api/dev/mailbox');
    expect(box.status).toBe(200);
    expect(box.json.enabled).toBe(true);
    expect(box.json.messages.some((m: { subject: string }) => m.subject === email.subject)).toBe(true);
  });

  it('retries while the mail server is down and delivers exactly once when it is back', async (ctx) => {
    if (!sink.own || !sink.dir) {
      console.warn('No SMTP sink this test can take down (MAIL_SINK_DIR unset): the outage is tested in tests/db/outbox.test.ts only.');
      return ctx.skip();
    }
    await sink.own.stop();
    let id = '';
    try {
      const res = await tech.post(`/api/calls/${visit.callId}/report-email`, {
        to: [visit.customerEmail],
        subject: `Retried report ${visit.siteName}`,
        body: 'Attached.',
        idempotencyKey: randomUUID(),
      });
      expect(res.status).toBe(201);
      id = res.json.message.id;
      const waiting = await waitFor('a failed attempt', async () => {
        const m = await outboxStatus(tech, visit.callId, id);
        return m && m.attempts >= 1 && m.status === 'queued' && m.lastError ? m : null;
      });
      // Our own sink is simply gone; the test command's sink answers 421 while it is down.
      expect(waiting.lastError).toMatch(/refused the connection|answered 421/);
    } finally {
      await sink.own.start();
    }
    await waitFor('the retried e-mail to be sent', async () => (await outboxStatus(tech, visit.callId, id))?.status === 'sent', 90_000);
    const copies = await waitFor('the caught copy', async () => caught(sink.dir!, id).length > 0 && caught(sink.dir!, id));
    await new Promise((r) => setTimeout(r, 3000));
    expect(caught(sink.dir, id)).toHaveLength(1);
    expect(copies[0].attachments[0].filename).toMatch(/\.pdf$/);
  }, 150_000);

  it('resends a sent message as a new one', async () => {
    const [row] = await db('outbox').where({ call_id: visit.callId, status: 'sent' }).orderBy('created_at').limit(1).select('id');
    const res = await tech.post(`/api/outbox/${row.id}/resend`, { idempotencyKey: randomUUID() });
    expect(res.status).toBe(201);
    expect(res.json.message.id).not.toBe(row.id);
    expect(res.json.message.attachmentName).toMatch(/\.pdf$/);
  });
});
