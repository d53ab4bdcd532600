import { Buffer } from 'node:buffer';
import { randomUUID } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

// An SMTP sink on loopback for the mail tests: it accepts every message and keeps its raw bytes.
// Stop and start it again on the same port to play a mail server that went down and came back.

export interface Sink {
  port: number;
  messages: Buffer[];
  stop(): Promise<void>;
  start(): Promise<void>;
}

/** `dir`: also write each message there as an .eml file, as the app's dev mailbox reads them. */
export async function startSink(port = 0, dir?: string): Promise<Sink> {
  if (dir) mkdirSync(dir, { recursive: true });
  const messages: Buffer[] = [];
  let server: SMTPServer | null = null;
  const sink: Sink = {
    port,
    messages,
    async start() {
      server = new SMTPServer({
        authOptional: true,
        disabledCommands: ['STARTTLS'],
        logger: false,
        onData(stream, _session, callback) {
          const chunks: Uint8Array[] = [];
          stream.on('data', (c: Uint8Array) => chunks.push(c));
          stream.on('end', () => {
            const raw = Buffer.concat(chunks);
            messages.push(raw);
            if (dir) writeFileSync(path.join(dir, `${Date.now()}-${randomUUID().slice(0, 8)}.eml`), new Uint8Array(raw));
            callback();
          });
        },
      });
      await new Promise<void>((resolve, reject) => {
        server!.once('error', reject);
        server!.listen(sink.port, '127.0.0.1', () => resolve());
      });
      const address = (server as unknown as { server: { address(): { port: number } } }).server.address();
      sink.port = address.port;
    },
    async stop() {
      if (!server) return;
      const s = server;
      server = null;
      await new Promise<void>((resolve) => s.close(() => resolve()));
    },
  };
  await sink.start();
  return sink;
}
