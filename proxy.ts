import { NextResponse, type NextRequest } from 'next/server';

// The edge of every page request (the JSON API has its headers from next.config.ts and counts its
// own bodies): methods and body sizes the app never takes are refused here, every page gets the
// security headers with a fresh CSP nonce, and a visitor without a session cookie is sent to sign in.
// Redirects only otherwise: the real checks (the session row, the role, the rows a user reaches)
// run in every operation and page (lib/server/operation.ts). No database and no lib/server here:
// this runs before every request and must stay cheap.

const ALLOWED_METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];
const MAX_BODY_BYTES = 1024 * 1024;
const BODYLESS = new Set(['GET', 'HEAD', 'OPTIONS']);
// The app's icons and manifest (app/icon.svg, app/favicon.ico, app/apple-icon.png, app/manifest.ts,
// public/icon-*.png): the sign-in page shows them too, so they are served without a session.
const ICON_FILES = /^\/(?:favicon\.ico|icon\.svg|apple-icon\.png|manifest\.webmanifest|icon-(?:192|512)\.png)$/;

/** 128 random bits, base64: a fresh nonce per request for the framework's scripts and our theme script. */
function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}

/**
 * Scripts run only with this request's nonce; 'strict-dynamic' lets them load the chunks they need
 * (the framework adds script tags at run time). Styles allow inline: React `style={{}}` attributes
 * and the chart's SVG (recharts) set inline styles, which nonces cannot cover, and a style cannot
 * run code. `next dev` evaluates modules for its refresh runtime, so it needs 'unsafe-eval'; a
 * production build does not get it.
 */
function contentSecurityPolicy(nonce: string): string {
  const dev = process.env.NODE_ENV === 'development';
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

function secure(response: NextResponse, csp: string, json = false): NextResponse {
  response.headers.set('Content-Security-Policy', csp);
  response.headers.set('X-Content-Type-Options', 'nosniff');
  // frame-ancestors for browsers that know CSP 2, this for the ones that do not.
  response.headers.set('X-Frame-Options', 'DENY');
  response.headers.set('Referrer-Policy', 'same-origin');
  if (json) response.headers.set('Cache-Control', 'no-store');
  return response;
}

function refuse(status: number, code: string, message: string, csp: string, headers: Record<string, string> = {}) {
  const response = NextResponse.json({ error: { code, message } }, { status, headers });
  return secure(response, csp, true);
}

export function proxy(request: NextRequest) {
  const nonce = newNonce();
  const csp = contentSecurityPolicy(nonce);
  const { pathname } = request.nextUrl;

  if (!ALLOWED_METHODS.includes(request.method)) {
    return refuse(405, 'method_not_allowed', `${request.method} is not a method this app answers.`, csp, {
      Allow: ALLOWED_METHODS.join(', '),
    });
  }
  // Refused on the declared length, before anyone reads the body.
  if (Number(request.headers.get('content-length') ?? 0) > MAX_BODY_BYTES) {
    return refuse(413, 'payload_too_large', 'The request is too large: at most 1 MB.', csp);
  }
  // A page takes a body only as a server action, and browsers always send those with a length.
  // Without one, the framework would read on and answer a body over its limit with a 500.
  if (!BODYLESS.has(request.method) && request.headers.has('transfer-encoding') && !request.headers.has('content-length')) {
    return refuse(411, 'length_required', 'A request to a page must say how long its body is (Content-Length).', csp);
  }
  if (pathname !== '/sign-in' && !ICON_FILES.test(pathname) && !request.cookies.has('pg_session')) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = '';
    return secure(NextResponse.redirect(url), csp);
  }
  // The framework reads the nonce from the request's own CSP header and puts it on its scripts;
  // the root layout reads x-nonce for the theme script.
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('Content-Security-Policy', csp);
  return secure(NextResponse.next({ request: { headers } }), csp);
}

export const config = {
  // The build's static files, the (switched off) image optimizer and the JSON API carry their
  // headers from next.config.ts, and scripts/http-guard.cjs refuses the API's unknown methods;
  // everything else passes here.
  matcher: ['/((?!_next/static|_next/image|api/).*)'],
};
