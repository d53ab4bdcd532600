import nodemailer, { type Transporter } from 'nodemailer';

// The SMTP transport, configured from the environment so a real mail server works unchanged:
// SMTP_HOST, SMTP_PORT, SMTP_SECURE ("true" for TLS from the start, port 465), SMTP_USER and
// SMTP_PASSWORD when the server wants them, MAIL_FROM. The local sink that `npm start` and
// `npm test` run speaks plain SMTP on loopback, so STARTTLS is not attempted unless
// SMTP_REQUIRE_TLS=true (a real server on port 587).

export interface MailConfig {
  host: string;
  port: number;
  secure: boolean;
  requireTls: boolean;
  user: string | null;
  password: string | null;
  from: string;
}

export function mailConfig(env: Record<string, string | undefined> = process.env): MailConfig {
  return {
    host: env.SMTP_HOST || '127.0.0.1',
    port: Number(env.SMTP_PORT) || 2525,
    secure: env.SMTP_SECURE === 'true',
    requireTls: env.SMTP_REQUIRE_TLS === 'true',
    user: env.SMTP_USER || null,
    password: env.SMTP_PASSWORD || null,
    from: env.MAIL_FROM || 'Proving Ground <no-reply@proving-ground.invalid>',
  };
}

export function createMailTransport(config: MailConfig = mailConfig()): Transporter {
  return nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.secure,
    ignoreTLS: !config.secure && !config.requireTls,
    requireTLS: config.requireTls,
    auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
    // A mail server that is down or stuck must not hold the worker: the message is retried later.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
}

export interface OutgoingMail {
  /** The outbox row's id: the Message-ID is made from it, so a copy sent twice is recognisable as one message. */
  id: string;
  to: string[];
  subject: string;
  text: string;
  attachment?: { name: string; content: Buffer; contentType: string } | null;
}

/** Sends one message; resolves to the server's message id, rejects with the server's reason. */
export async function sendMail(transport: Transporter, from: string, mail: OutgoingMail): Promise<string | null> {
  const info = await transport.sendMail({
    from,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    messageId: `<${mail.id}@proving-ground.outbox>`,
    headers: { 'X-Outbox-Id': mail.id },
    attachments: mail.attachment
      ? [{ filename: mail.attachment.name, content: mail.attachment.content, contentType: mail.attachment.contentType }]
      : [],
  });
  return info.messageId ?? null;
}
