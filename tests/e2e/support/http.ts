import { randomUUID } from 'node:crypto';

// A black-box client for the JSON API with its own cookie jar, one per identity.
export const BASE_URL = process.env.E2E_BASE_URL ?? '';
if (!BASE_URL) throw new Error('BASE_URL is not set; the e2e stage of scripts/test.mjs serves the app and sets it.');

export const DEMO_PASSWORD = 'demo-password';
export const SIGN_IN_REFUSED = 'That e-mail and password do not match an active account.';

export interface ApiResponse<T = any> {
  status: number;
  headers: Headers;
  json: T;
  text: string;
  setCookies: string[];
}

export interface CallOptions {
  /** Sent as is, with content-type JSON, instead of JSON.stringify(body). */
  raw?: string;
  headers?: Record<string, string>;
}

export class ApiClient {
  private jar = new Map<string, string>();

  /** A distinct client address per client, so the per-address sign-in limit of one test never blocks another. */
  constructor(readonly address: string = `10.${rnd()}.${rnd()}.${rnd()}`) {}

  get cookieHeader(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  hasCookie(name: string): boolean {
    return this.jar.has(name);
  }

  /** A second client holding the same cookies: another browser tab of the same session. */
  clone(): ApiClient {
    const copy = new ApiClient(this.address);
    for (const [k, v] of this.jar) copy.jar.set(k, v);
    return copy;
  }

  async call<T = any>(method: string, path: string, body?: unknown, options: CallOptions = {}): Promise<ApiResponse<T>> {
    const headers: Record<string, string> = { 'x-forwarded-for': this.address, ...options.headers };
    if (this.jar.size) headers.cookie = this.cookieHeader;
    let payload: string | undefined;
    if (options.raw !== undefined) payload = options.raw;
    else if (body !== undefined) payload = JSON.stringify(body);
    if (payload !== undefined) headers['content-type'] ??= 'application/json';
    const res = await fetch(BASE_URL + path, { method, headers, body: payload, redirect: 'manual' });
    const setCookies = res.headers.getSetCookie();
    for (const line of setCookies) {
      const [pair, ...attrs] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      const expired = attrs.some(
        (a) => /^\s*max-age=0\s*$/i.test(a) || (/^\s*expires=/i.test(a) && Date.parse(a.split('=')[1]) < Date.now()),
      );
      if (!value || expired) this.jar.delete(name);
      else this.jar.set(name, value);
    }
    const text = await res.text();
    let json: any = null;
    try {
      json = JSON.parse(text);
    } catch {
      json = null;
    }
    return { status: res.status, headers: res.headers, json, text, setCookies };
  }

  get = <T = any>(path: string) => this.call<T>('GET', path);
  post = <T = any>(path: string, body?: unknown, options?: CallOptions) => this.call<T>('POST', path, body, options);
  patch = <T = any>(path: string, body?: unknown, options?: CallOptions) => this.call<T>('PATCH', path, body, options);

  signIn(email: string, password = DEMO_PASSWORD) {
    return this.post('/api/auth/sign-in', { email, password });
  }
}

function rnd(): number {
  return Math.floor(Math.random() * 250) + 1;
}

export const unique = (label: string) => `${label}-${randomUUID().slice(0, 8)}`;

export const DEMO = {
  apprentice: 'apprentice@demo.test',
  technician: 'technician@demo.test',
  lead: 'lead@demo.test',
  lead2: 'lead2@demo.test',
  trainer: 'trainer@demo.test',
  admin: 'admin@demo.test',
  otherAdmin: 'admin@other.demo.test',
  otherTechnician: 'technician@other.demo.test',
} as const;

/** A client already signed in as `email`; fails loudly if the sign-in does not succeed. */
export async function signedIn(email: string, password = DEMO_PASSWORD): Promise<ApiClient> {
  const client = new ApiClient();
  const res = await client.signIn(email, password);
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${res.text}`);
  return client;
}
