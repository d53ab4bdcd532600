// @vitest-environment node
import { Buffer } from 'node:buffer';
import nodemailer from 'nodemailer';
import { decodeWords, parseEml } from '@/lib/mail/eml';

// The dev mailbox's reader against messages nodemailer itself builds (its stream transport makes
// the same RFC 5322 bytes the SMTP transport sends), so the reference is the library, not us.
async function build(options: Parameters<ReturnType<typeof nodemailer.createTransport>['sendMail']>[0]): Promise<Buffer> {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
  const info = await transport.sendMail({ from: 'Proving Ground <no-reply@demo.test>', ...options });
  return info.message as Buffer;
}

describe('parseEml', () => {
  it('reads the subject, addresses, text and a binary attachment byte for byte', async () => {
    const pdf = Buffer.from(new Uint8Array([...Buffer.from('%PDF-1.3\n'), ...Array.from({ length: 3000 }, (_, i) => i % 256)]));
    const raw = await build({
      to: ['a@demo.test', 'b@demo.test'],
      subject: 'Service report: Café Süd, Basement furnace',
      text: 'Hello,\n\nFlame signal 4.2 µA after the repair — within.\n',
      attachments: [{ filename: 'service-report-Cafe-Sud-2026-12-02.pdf', content: pdf, contentType: 'application/pdf' }],
    });
    const eml = parseEml(raw);
    expect(eml.subject).toBe('Service report: Café Süd, Basement furnace');
    expect(eml.to).toBe('a@demo.test, b@demo.test');
    expect(eml.from).toContain('no-reply@demo.test');
    expect(eml.text).toContain('Flame signal 4.2 µA after the repair — within.');
    expect(eml.attachments).toHaveLength(1);
    expect(eml.attachments[0].filename).toBe('service-report-Cafe-Sud-2026-12-02.pdf');
    expect(eml.attachments[0].contentType).toBe('application/pdf');
    expect(eml.attachments[0].content.toString('hex')).toBe(pdf.toString('hex'));
  });

  it('reads a plain message without parts', async () => {
    const eml = parseEml(await build({ to: 'x@demo.test', subject: 'Plain', text: 'Only text' }));
    expect(eml.subject).toBe('Plain');
    expect(eml.text.trim()).toBe('Only text');
    expect(eml.attachments).toEqual([]);
  });

  it('decodes RFC 2047 words (Q and B)', () => {
    // RFC 2047 §8 examples.
    expect(decodeWords('=?ISO-8859-1?Q?Andr=E9?= Pirard')).toBe('André Pirard');
    expect(decodeWords('=?UTF-8?B?w5xiZXI=?=')).toBe('Über');
    expect(decodeWords('=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=')).toBe('ab');
  });
});
