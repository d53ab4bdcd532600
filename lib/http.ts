// A JSON POST from the browser that always ends: an answer, a refusal with the server's message,
// no connection, or no answer within the timeout. Forms use it so that a button never stays busy.

/** How long a form waits for the server before it says that the server did not answer. */
export const REQUEST_TIMEOUT_MS = 15_000;

export type PostResult =
  | { kind: 'ok'; status: number; body: unknown }
  | { kind: 'refused'; status: number; code?: string; message?: string; retryAfterSeconds?: number }
  | { kind: 'offline' }
  | { kind: 'timeout' };

export async function postJson(url: string, body?: unknown, { timeoutMs = REQUEST_TIMEOUT_MS } = {}): Promise<PostResult> {
  const controller = new AbortController();
  const timer = setTimeout(() => controller.abort(), timeoutMs);
  try {
    const res = await fetch(url, {
      method: 'POST',
      headers: body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal: controller.signal,
    });
    // Reading the body is covered by the same timeout: a server can stall half-way through an answer.
    const text = await res.text();
    let json: unknown = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = null;
    }
    if (res.ok) return { kind: 'ok', status: res.status, body: json };
    const error = (json as { error?: { code?: unknown; message?: unknown } } | null)?.error;
    return {
      kind: 'refused',
      status: res.status,
      code: typeof error?.code === 'string' ? error.code : undefined,
      message: typeof error?.message === 'string' && error.message ? error.message : undefined,
      retryAfterSeconds: retryAfterSeconds(res.headers.get('retry-after')),
    };
  } catch {
    return controller.signal.aborted ? { kind: 'timeout' } : { kind: 'offline' };
  } finally {
    clearTimeout(timer);
  }
}

/** Retry-After as seconds from now: either a number of seconds or an HTTP date (RFC 9110, 10.2.3). */
export function retryAfterSeconds(header: string | null, now: number = Date.now()): number | undefined {
  if (!header) return undefined;
  const value = header.trim();
  if (/^\d+$/.test(value)) return Number(value);
  // An HTTP date always names its day and month; this keeps "-5" or "2" from parsing as a year.
  const at = /[a-z]{3}/i.test(value) ? Date.parse(value) : NaN;
  if (Number.isNaN(at)) return undefined;
  return Math.max(0, Math.ceil((at - now) / 1000));
}

/** A wait in words, rounded up to what a person would say: "1 second", "45 seconds", "2 minutes", "3 hours". */
export function waitInWords(seconds: number): string {
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  if (seconds < 60) return plural(Math.max(1, Math.ceil(seconds)), 'second');
  if (seconds < 3600) return plural(Math.ceil(seconds / 60), 'minute');
  return plural(Math.ceil(seconds / 3600), 'hour');
}

export const NO_ANSWER = 'The server did not answer. Check the connection and try again; nothing was changed.';
export const NO_CONNECTION = 'The server could not be reached. Check the connection and try again; nothing was changed.';
