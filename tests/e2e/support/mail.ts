import { readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseEml, type ParsedEml } from '@/lib/mail/eml';
import type { ApiClient } from '@/tests/e2e/support/http';
import { startSink, type Sink } from '@/tests/support/smtp-sink';

// The SMTP sink the app sends to in the HTTP and browser tests. When the test command runs one
// (scripts/fakes.mjs), it is used as it is, and taken down by writing its `.refuse` file (it then
// answers 421); otherwise, given SMTP_PORT and MAIL_SINK_DIR, the test runs its own on that port,
// writing .eml files where the dev mailbox reads them, and stops and starts it.

/** A mail server the test can take down and bring back. */
export interface Switch {
  stop(): Promise<void>;
  start(): Promise<void>;
}

export interface MailSink {
  dir: string | null;
  /** Takes the sink down and back up; null when there is no sink the test knows of. */
  own: Switch | null;
  stop(): Promise<void>;
}

const REFUSE_FILE = '.refuse';

export async function useMailSink(): Promise<MailSink> {
  const dir = process.env.MAIL_SINK_DIR || null;
  const port = Number(process.env.SMTP_PORT) || 2525;
  let sink: Sink | null = null;
  let own: Switch | null = null;
  if (dir) {
    try {
      sink = await startSink(port, dir);
      own = sink;
    } catch (error) {
      if ((error as { code?: string }).code !== 'EADDRINUSE') throw error;
      // Another process runs the sink (scripts/fakes.mjs): it refuses while the file exists.
      own = {
        stop: async () => writeFileSync(path.join(dir, REFUSE_FILE), 'down'),
        start: async () => rmSync(path.join(dir, REFUSE_FILE), { force: true }),
      };
    }
  }
  return {
    dir,
    own,
    stop: async () => {
      await sink?.stop();
      if (dir && !sink) rmSync(path.join(dir, REFUSE_FILE), { force: true });
    },
  };
}

/** The caught messages the app sent from outbox row `outboxId`. */
export function caught(dir: string, outboxId: string): ParsedEml[] {
  return readdirSync(dir)
    .filter((n) => n.endsWith('.eml'))
    .map((n) => parseEml(readFileSync(path.join(dir, n))))
    .filter((m) => m.headers['x-outbox-id'] === outboxId);
}

export async function waitFor<T>(what: string, probe: () => Promise<T | null | undefined | false>, timeoutMs = 45_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

/** The e-mail of a call with this id, as the call's report page lists it. */
export async function outboxStatus(client: ApiClient, callId: string, id: string) {
  const res = await client.get(`/api/calls/${callId}/report-email`);
  return (res.json?.messages as { id: string; status: string; lastError: string | null; attempts: number }[] | undefined)?.find(
    (m) => m.id === id,
  );
}
