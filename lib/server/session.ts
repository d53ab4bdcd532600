import 'server-only';
import { getIronSession, type SessionOptions } from 'iron-session';
import { cookies } from 'next/headers';

export interface SessionData {
  /** The `sessions` row this cookie stands for; the server checks it on every request. */
  sid?: string;
}

export const SESSION_TTL_SECONDS = 60 * 60 * 12;

function secret(): string {
  const value = process.env.SESSION_SECRET;
  if (!value || value.length < 32) {
    // scripts/start.mjs and scripts/test.mjs always provide one; a deployment must set its own.
    throw new Error('SESSION_SECRET must be set to at least 32 characters.');
  }
  return value;
}

function secureCookie(): boolean {
  if (process.env.COOKIE_SECURE) return process.env.COOKIE_SECURE === 'true';
  // Served over plain http on loopback by `npm start`; anything else in production is https.
  return process.env.NODE_ENV === 'production' && !(process.env.APP_URL ?? '').startsWith('http://');
}

export function sessionOptions(): SessionOptions {
  return {
    password: secret(),
    cookieName: 'pg_session',
    ttl: SESSION_TTL_SECONDS,
    cookieOptions: { httpOnly: true, sameSite: 'lax', secure: secureCookie(), path: '/' },
  };
}

export async function getSession() {
  const store = await cookies();
  const options = sessionOptions();
  try {
    return await getIronSession<SessionData>(store, options);
  } catch {
    // iron-session throws on a cookie that is not one of our seals (tampered, truncated, or set by
    // another app on this host); that is no session, not a server error. Saving or destroying the
    // fresh session still writes the real cookie and so replaces the bad one.
    const withoutBadCookie = {
      get: (name: string) => (name === options.cookieName ? undefined : store.get(name)),
      set: store.set.bind(store) as typeof store.set,
    };
    return getIronSession<SessionData>(withoutBadCookie, options);
  }
}
