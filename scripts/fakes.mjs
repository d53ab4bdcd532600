// The local fakes `npm start`, `npm run dev` and `npm test` run beside the app, on loopback:
// - an S3-compatible object store (s3rver) holding the photos, its bucket created on start;
// - an SMTP sink (smtp-server) that accepts every message and writes it as an .eml file into
//   MAIL_SINK_DIR, where the dev mailbox reads it.
// Run as its own process (`node scripts/fakes.mjs --s3-port … --smtp-port … --s3-dir … --mail-dir …`)
// so that a blocking child (vitest under spawnSync) does not freeze it; scripts/lib.mjs
// `startFakes` does that and passes the environment below to the app and the tests.
// A real bucket or mail server is used instead by setting S3_ENDPOINT or SMTP_HOST from outside.
//
// The sink refuses connections (421) while a file named `.refuse` exists in its directory: a test
// writes it to play "the mail server is down" and removes it to bring it back.
import { randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

export const S3_BUCKET = 'proving-ground';
// s3rver checks signatures against these fixed credentials.
export const S3_KEY = 'S3RVER';
export const REFUSE_FILE = '.refuse';

/** The environment the app and the tests read, for fakes on these ports. */
export function fakesEnv({ s3Port, smtpPort, mailDir }) {
  const env = {};
  if (s3Port) {
    Object.assign(env, {
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      S3_REGION: 'us-east-1',
      S3_BUCKET,
      S3_ACCESS_KEY_ID: S3_KEY,
      S3_SECRET_ACCESS_KEY: S3_KEY,
      S3_FORCE_PATH_STYLE: 'true',
    });
  }
  if (smtpPort) {
    Object.assign(env, {
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(smtpPort),
      SMTP_SECURE: 'false',
      MAIL_FROM: 'Proving Ground <no-reply@proving-ground.invalid>',
      MAIL_SINK_DIR: mailDir,
    });
  }
  return env;
}

/** s3rver on 127.0.0.1:`port` storing in `dir`, with the bucket. Returns { port, stop }. */
export async function startS3({ port = 0, dir, bucket = S3_BUCKET }) {
  const { default: S3rver } = await import('s3rver');
  mkdirSync(dir, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    directory: dir,
    silent: true,
    configureBuckets: [{ name: bucket }],
  });
  const address = await server.run();
  return { port: address.port, stop: () => server.close().catch(() => {}) };
}

/** The SMTP sink on 127.0.0.1:`port`, writing .eml files into `dir`. Returns { port, stop, start }. */
export async function startSmtp({ port = 0, dir }) {
  const { SMTPServer } = await import('smtp-server');
  mkdirSync(dir, { recursive: true });
  let server = null;
  const handle = {
    port,
    async start() {
      server = new SMTPServer({
        authOptional: true,
        disabledCommands: ['STARTTLS'],
        logger: false,
        size: 30 * 1024 * 1024,
        onConnect(_session, callback) {
          if (existsSync(path.join(dir, REFUSE_FILE))) {
            const error = new Error('The local mail sink is switched off for a test');
            error.responseCode = 421;
            return callback(error);
          }
          callback();
        },
        onData(stream, _session, callback) {
          const chunks = [];
          stream.on('data', (c) => chunks.push(c));
          stream.on('end', () => {
            const name = `${Date.now()}-${randomUUID().slice(0, 8)}.eml`;
            try {
              writeFileSync(path.join(dir, name), Buffer.concat(chunks));
              callback();
            } catch (error) {
              callback(error);
            }
          });
        },
      });
      server.on('error', () => {});
      await new Promise((resolve, reject) => {
        server.server.once('error', reject);
        server.listen(handle.port, '127.0.0.1', () => resolve());
      });
      handle.port = server.server.address().port;
    },
    async stop() {
      if (!server) return;
      const s = server;
      server = null;
      await new Promise((resolve) => s.close(() => resolve()));
    },
  };
  await handle.start();
  return handle;
}

function arg(name) {
  const i = process.argv.indexOf(`--${name}`);
  return i === -1 ? undefined : process.argv[i + 1];
}

// Standalone: start what was asked for, print one line of JSON when ready, stop on SIGTERM/SIGINT
// or when the parent goes away (its end of stdin closes).
if (import.meta.url === `file://${process.argv[1]}`) {
  const stops = [];
  const ready = {};
  const stop = async (code = 0) => {
    await Promise.all(stops.map((s) => s()));
    process.exit(code);
  };
  process.on('SIGTERM', () => stop(0));
  process.on('SIGINT', () => stop(0));
  process.stdin.on('end', () => stop(0));
  process.stdin.on('error', () => stop(0));
  process.stdin.resume();
  try {
    if (arg('s3-dir')) {
      const s3 = await startS3({ port: Number(arg('s3-port') ?? 0), dir: arg('s3-dir') });
      stops.push(s3.stop);
      ready.s3Port = s3.port;
    }
    if (arg('mail-dir')) {
      const smtp = await startSmtp({ port: Number(arg('smtp-port') ?? 0), dir: arg('mail-dir') });
      stops.push(smtp.stop);
      ready.smtpPort = smtp.port;
    }
    process.stdout.write(`${JSON.stringify({ ready: true, ...ready })}\n`);
  } catch (error) {
    process.stderr.write(`The local fakes did not start: ${error.message}\n`);
    await stop(1);
  }
}
