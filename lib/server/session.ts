import 'server-only';
import { getIronSession, unsealData, type SessionOptions } from 'iron-session';
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

// Unsealing a cookie derives its keys with PBKDF2 on every request (about 5 % of a save's CPU in
// `npm run bench -- --cpu-prof`). A seal is immutable, so the session id inside one is cached by
// the exact cookie value, never past the seal's own expiry. This only spares the crypto: every
// request still checks the sessions row (revoked, expired, ended everywhere) in requireUser.
const unsealed = new Map<string, { sid: string | undefined; until: number }>();
const MAX_UNSEALED = 5_000;

/** The expiry iron writes into a seal (`Fe26.2*id*salt*iv*data*expiration*hmacSalt*hmac`), in ms. */
function sealExpiry(seal: string): number {
  const expiration = Number(seal.split('*')[5]);
  return Number.isFinite(expiration) && expiration > 0 ? expiration : 0;
}

/** The session id of this request's cookie, or undefined (no cookie, a bad or expired seal). */
export async function readSessionId(): Promise<string | undefined> {
  const options = sessionOptions();
  const seal = (await cookies()).get(options.cookieName)?.value;
  if (!seal) return undefined;
  const now = Date.now();
  const hit = unsealed.get(seal);
  if (hit && hit.until > now) return hit.sid;
  let sid: string | undefined;
  try {
    sid = (await unsealData<SessionData>(seal, { password: options.password, ttl: options.ttl })).sid;
  } catch {
    sid = undefined; // not one of our seals: no session
  }
  const until = sealExpiry(seal);
  if (sid && until > now) {
    if (unsealed.size >= MAX_UNSEALED) unsealed.delete(unsealed.keys().next().value!);
    unsealed.set(seal, { sid, until });
  }
  return sid;
}
