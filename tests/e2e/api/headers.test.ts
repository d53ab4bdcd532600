// The edge over HTTP: the security headers on every kind of response, a fresh CSP nonce on the
// page's scripts, 405 for methods the app never takes and 413 for bodies over 1 MB, on every path.
// @vitest-environment node
import { readFileSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, BASE_URL, DEMO, signedIn, unique, type ApiResponse } from '../support/http';

const MB = 1024 * 1024;
const ALLOW = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];

interface Raw {
  status: number;
  headers: Headers;
  text: string;
  json: any;
}

/**
 * A request through node:http: Node's fetch refuses TRACE and CONNECT and sets its own length.
 * A body given as `chunks` goes out with Transfer-Encoding: chunked and no Content-Length.
 */
function raw(
  method: string,
  url: string,
  options: { headers?: Record<string, string>; body?: Buffer; chunks?: Buffer[] } = {},
): Promise<Raw> {
  return new Promise((resolve, reject) => {
    let answered = false;
    const finish = (res: http.IncomingMessage, text: string) => {
      const headers = new Headers();
      for (const [k, v] of Object.entries(res.headers)) if (v !== undefined) headers.set(k, Array.isArray(v) ? v.join(', ') : v);
      let json: any = null;
      try {
        json = JSON.parse(text);
      } catch {
        json = null;
      }
      resolve({ status: res.statusCode ?? 0, headers, text, json });
    };
    // Node's client sends a DELETE or OPTIONS body without a length unless told one.
    const headers = { ...options.headers };
    if (options.body && !Object.keys(headers).some((k) => k.toLowerCase() === 'content-length'))
      headers['content-length'] = String(options.body.length);
    // A connection of its own: a refused request must not leave bytes for the next one to trip on.
    const req = http.request(BASE_URL + url, { method, headers, agent: false }, (res) => {
      answered = true;
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (text += c));
      res.on('end', () => finish(res, text));
    });
    // Node's client hands the answer to a CONNECT to 'connect', with the body on the bare socket.
    req.on('connect', (res, socket, head) => {
      answered = true;
      let text = head.toString('utf8');
      socket.setEncoding('utf8');
      socket.on('data', (c: string) => (text += c));
      socket.on('end', () => finish(res, text));
    });
    // The server may answer and close before it has read a refused body; the answer still counts.
    req.on('error', (error: NodeJS.ErrnoException) => {
      if (error.code !== 'EPIPE' && error.code !== 'ECONNRESET') reject(error);
    });
    req.on('close', () => {
      if (!answered) reject(new Error(`${method} ${url}: the connection closed without an answer`));
    });
    if (options.chunks) {
      for (const chunk of options.chunks) req.write(chunk);
      req.end();
    } else req.end(options.body);
  });
}

/** The CSP as a map from directive to its sources. */
function policy(res: { headers: Headers }): Map<string, string[]> {
  const header = res.headers.get('content-security-policy') ?? '';
  return new Map(
    header
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0])
      .map(([name, ...sources]) => [name, sources]),
  );
}

/** What every response carries, whatever answered it (proxy, route handler, static file, guard). */
function expectSecured(res: { status: number; headers: Headers }, what: string) {
  const csp = policy(res);
  expect(csp.get('frame-ancestors'), `${what}: frame-ancestors`).toEqual(["'none'"]);
  expect(csp.get('object-src'), `${what}: object-src`).toEqual(["'none'"]);
  expect(["'self'", "'none'"], `${what}: base-uri`).toContain(csp.get('base-uri')?.join(' '));
  expect(["'self'", "'none'"], `${what}: form-action`).toContain(csp.get('form-action')?.join(' '));
  expect(res.headers.get('x-content-type-options'), `${what}: nosniff`).toBe('nosniff');
  expect(res.headers.get('x-frame-options'), `${what}: X-Frame-Options`).toBe('DENY');
  expect(['same-origin', 'strict-origin-when-cross-origin', 'no-referrer'], `${what}: Referrer-Policy`).toContain(
    res.headers.get('referrer-policy'),
  );
}

/** A page's policy: the app's own sources, this response's nonce, no inline or eval scripts. */
function expectPagePolicy(res: { headers: Headers }, what: string): string {
  const csp = policy(res);
  const scripts = csp.get('script-src') ?? [];
  const nonce = scripts.map((s) => /^'nonce-([A-Za-z0-9+/=_-]+)'$/.exec(s)?.[1]).find(Boolean);
  expect(nonce, `${what}: a nonce in script-src`).toBeTruthy();
  expect(scripts, what).toContain("'strict-dynamic'");
  // A production build (the one under test) needs no eval; inline scripts run only with the nonce.
  expect(scripts, what).not.toContain("'unsafe-eval'");
  expect(scripts, what).not.toContain("'unsafe-inline'");
  expect(csp.get('default-src'), what).toEqual(["'self'"]);
  expect(csp.get('style-src'), what).toEqual(["'self'", "'unsafe-inline'"]);
  expect(csp.get('img-src'), what).toEqual(["'self'", 'data:', 'blob:']);
  expect(csp.get('font-src'), what).toEqual(["'self'"]);
  expect(csp.get('connect-src'), what).toEqual(["'self'"]);
  expect(csp.get('base-uri'), what).toEqual(["'self'"]);
  expect(csp.get('form-action'), what).toEqual(["'self'"]);
  return nonce!;
}

/** Every <script> tag of the page carries this response's nonce, and there is at least one. */
function expectScriptsNonced(html: string, nonce: string, what: string) {
  const tags = html.match(/<script\b[^>]*>/g) ?? [];
  expect(tags.length, `${what}: script tags`).toBeGreaterThan(0);
  const without = tags.filter((t) => !t.includes(`nonce="${nonce}"`));
  expect(without, `${what}: script tags without this response's nonce`).toEqual([]);
}

function expectError(res: { status: number; headers: Headers; json: any }, status: number, code: string) {
  expect(res.status).toBe(status);
  expect(res.headers.get('content-type')).toMatch(/^application\/json/);
  expect(res.json?.error?.code).toBe(code);
  expect(typeof res.json?.error?.message).toBe('string');
  expect(res.json.error.message.length).toBeGreaterThan(0);
}

/** A server action's id from the build's manifest: the same id the page's own script sends. */
function actionId(name: string): string {
  const dist = process.env.NEXT_DIST_DIR ?? '.next-test';
  const manifest = JSON.parse(readFileSync(path.resolve(dist, 'server', 'server-reference-manifest.json'), 'utf8'));
  const entry = Object.entries(manifest.node as Record<string, { exportedName?: string }>).find(([, v]) => v.exportedName === name);
  if (!entry) throw new Error(`no server action ${name} in ${dist}`);
  return entry[0];
}

let tech: ApiClient;
let anon: ApiClient;
let signInPage: ApiResponse;

beforeAll(async () => {
  tech = await signedIn(DEMO.technician);
  anon = new ApiClient();
  signInPage = await anon.get('/sign-in');
});

describe('headers on every response', () => {
  it('on the sign-in page: the page policy, with a nonce that is on every script tag and new on every request', async () => {
    expect(signInPage.status).toBe(200);
    expectSecured(signInPage, '/sign-in');
    const first = expectPagePolicy(signInPage, '/sign-in');
    expectScriptsNonced(signInPage.text, first, '/sign-in');
    // The theme script in the root layout is one of them.
    expect(signInPage.text).toMatch(new RegExp(`<script nonce="${first.replace(/[+/=]/g, '\\$&')}">try\\{var t=localStorage`));
    const again = await anon.get('/sign-in');
    const second = expectPagePolicy(again, '/sign-in again');
    expect(second).not.toBe(first);
    expectScriptsNonced(again.text, second, '/sign-in again');
    expect(again.text).not.toContain(first);
  });

  it('on signed-in pages, and on the redirect to sign in', async () => {
    for (const url of ['/', '/calls', '/units']) {
      const page = await tech.get(url);
      expect(page.status, url).toBe(200);
      expectSecured(page, url);
      expectScriptsNonced(page.text, expectPagePolicy(page, url), url);
    }
    const redirect = await anon.get('/calls');
    expect(redirect.status).toBe(307);
    expect(new URL(redirect.headers.get('location')!, BASE_URL).pathname).toBe('/sign-in');
    expectSecured(redirect, 'redirect to /sign-in');
  });

  it('on API JSON, answers and errors alike, with Cache-Control: no-store', async () => {
    const responses = {
      'GET /api/me': await tech.get('/api/me'),
      'GET /api/calls': await tech.get('/api/calls'),
      'GET /api/me, signed out (401)': await anon.get('/api/me'),
      'GET /api/calls/{unknown} (404)': await tech.get('/api/calls/00000000-0000-4000-8000-000000000000'),
      'POST /api/sites, invalid (400)': await tech.post('/api/sites', { name: '' }),
    };
    expect(responses['GET /api/me'].status).toBe(200);
    expect(responses['GET /api/me, signed out (401)'].status).toBe(401);
    expect(responses['GET /api/calls/{unknown} (404)'].status).toBe(404);
    expect(responses['POST /api/sites, invalid (400)'].status).toBe(400);
    for (const [what, res] of Object.entries(responses)) {
      expect(res.headers.get('content-type'), what).toMatch(/^application\/json/);
      expect(res.headers.get('cache-control'), what).toMatch(/\bno-store\b/);
      expectSecured(res, what);
    }
  });

  it('on the build’s static files, a missing one, and the image path', async () => {
    const css = /\/_next\/static\/[^"]+\.css/.exec(signInPage.text)?.[0];
    const js = /\/_next\/static\/[^"]+\.js/.exec(signInPage.text)?.[0];
    expect(css).toBeTruthy();
    expect(js).toBeTruthy();
    for (const url of [css!, js!]) {
      const res = await anon.get(url);
      expect(res.status, url).toBe(200);
      expectSecured(res, url);
    }
    const missing = await anon.get('/_next/static/chunks/no-such-file.js');
    expect(missing.status).toBe(404);
    expectSecured(missing, 'missing static file');
    // No raster images in the app, so the optimizer is off: a 404, not a 500 from fetching the path.
    const image = await tech.get('/_next/image?url=%2Fno-such.png&w=64&q=75');
    expect(image.status).toBe(404);
    expectSecured(image, '/_next/image');
  });

  it('on a page that does not exist', async () => {
    const res = await tech.get('/no-such-page');
    expect(res.status).toBe(404);
    expectSecured(res, '/no-such-page');
    expectScriptsNonced(res.text, expectPagePolicy(res, '/no-such-page'), '/no-such-page');
  });
});

describe('methods the app never takes: 405 with Allow, on every path', () => {
  const paths = ['/api/calls', '/calls', '/sign-in', '/no-such-page'];

  // TRACE: fetch refuses it; CONNECT: Node hands it to no request handler; PROPFIND and MKCOL:
  // methods Node parses and the proxy refuses; BREW and JUNK: names Node's parser does not know.
  for (const method of ['TRACE', 'CONNECT', 'PROPFIND', 'MKCOL', 'BREW', 'JUNK']) {
    it(method, async () => {
      for (const url of paths) {
        const res = await raw(method, url, { headers: { cookie: tech.cookieHeader } });
        expectError(res, 405, 'method_not_allowed');
        expect(res.headers.get('allow')?.split(/,\s*/), `${method} ${url}`).toEqual(ALLOW);
        expectSecured(res, `${method} ${url}`);
      }
    });
  }

  it('on the build’s static files: anything but GET and HEAD, instead of a 500', async () => {
    const css = /\/_next\/static\/[^"]+\.css/.exec(signInPage.text)![0];
    for (const method of ['POST', 'PUT', 'DELETE', 'OPTIONS', 'PROPFIND']) {
      const res = await raw(method, css, { body: Buffer.from('x') });
      expectError(res, 405, 'method_not_allowed');
      expect(res.headers.get('allow'), method).toBe('GET, HEAD');
      expectSecured(res, `${method} on a static file`);
    }
    expect((await raw('HEAD', css)).status).toBe(200);
  });

  it('a method a route handler does not export answers 405, not 500', async () => {
    for (const [method, url] of [
      ['DELETE', '/api/calls'],
      ['PUT', '/api/sites'],
      ['PATCH', '/api/me'],
    ]) {
      const res = await tech.call(method, url, method === 'DELETE' ? undefined : {});
      expect(res.status, `${method} ${url}`).toBe(405);
      expectSecured(res, `${method} ${url}`);
    }
  });
});

describe('bodies over 1 MB: 413 before the body is read', () => {
  it('on a JSON route, with the declared length or without one (chunked), storing nothing', async () => {
    const name = unique('Oversized site');
    const body = Buffer.from(JSON.stringify({ name, address: '1 Heavy Rd', pad: 'a'.repeat(2 * MB) }));
    expect(body.length).toBeGreaterThan(2 * MB);
    const headers = { 'content-type': 'application/json', cookie: tech.cookieHeader, origin: BASE_URL };
    const declared = await raw('POST', '/api/sites', { headers: { ...headers, 'content-length': String(body.length) }, body });
    expectError(declared, 413, 'payload_too_large');
    expectSecured(declared, '413 with a length');
    const chunked = await raw('POST', '/api/sites', { headers, chunks: [body.subarray(0, MB), body.subarray(MB)] });
    expectError(chunked, 413, 'payload_too_large');
    const sites = await tech.get('/api/sites');
    expect(sites.status).toBe(200);
    expect(sites.json.some((s: { name: string }) => s.name === name)).toBe(false);
    // The same request under 1 MB is taken: the refusal is about the size.
    const small = await tech.post('/api/sites', { name, address: '1 Heavy Rd' }, { headers: { origin: BASE_URL } });
    expect(small.status, small.text).toBe(201);
  });

  it('on a page, as a server action: 413 with the declared length, 411 without one, never 500', async () => {
    const action = actionId('createSiteAction');
    const name = unique('Oversized action site');
    const headers = {
      'next-action': action,
      'content-type': 'text/plain;charset=UTF-8',
      accept: 'text/x-component',
      origin: BASE_URL,
      cookie: tech.cookieHeader,
    };
    const big = Buffer.from(JSON.stringify([{ name, address: '2 Heavy Rd', pad: 'a'.repeat(2 * MB) }]));
    const declared = await raw('POST', '/calls/new', { headers: { ...headers, 'content-length': String(big.length) }, body: big });
    expectError(declared, 413, 'payload_too_large');
    expectSecured(declared, 'server action 413');
    // Without a length the framework would read past its limit and answer 500; browsers always send one.
    const chunked = await raw('POST', '/calls/new', { headers, chunks: [big.subarray(0, MB), big.subarray(MB)] });
    expectError(chunked, 411, 'length_required');
    const chunkedSmall = await raw('POST', '/calls/new', { headers, chunks: [Buffer.from(JSON.stringify([{ name, address: '2' }]))] });
    expectError(chunkedSmall, 411, 'length_required');
    expect((await tech.get('/api/sites')).json.some((s: { name: string }) => s.name === name)).toBe(false);
    // The same action with a small body, sent as the page sends it, is taken.
    const small = Buffer.from(JSON.stringify([{ name, address: '2 Heavy Rd' }]));
    const taken = await raw('POST', '/calls/new', { headers: { ...headers, 'content-length': String(small.length) }, body: small });
    expect(taken.status, taken.text.slice(0, 200)).toBe(200);
    expect((await tech.get('/api/sites')).json.some((s: { name: string }) => s.name === name)).toBe(true);
  });

  it('on a page path without a session: 413 before the redirect to sign in', async () => {
    const big = Buffer.alloc(2 * MB, 'a');
    const res = await raw('POST', '/calls', { headers: { 'content-type': 'text/plain', 'content-length': String(big.length) }, body: big });
    expectError(res, 413, 'payload_too_large');
    expectSecured(res, 'page 413');
  });
});
