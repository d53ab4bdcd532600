import { NextResponse, type NextRequest } from 'next/server';

// The edge of every request: methods and body sizes the app never takes are refused here, every
// response gets the security headers, and a visitor without a session cookie is sent to sign in.
// Redirects only otherwise: the real checks (the session row, the role, the rows a user reaches)
// run in every operation and page (lib/server/operation.ts).

const METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];
const MAX_BODY_BYTES = 1024 * 1024;

/**
 * A fresh nonce per request for the framework's scripts and our one inline script (the theme).
 * Styles allow inline: React `style` attributes and the chart's SVG use them, and a style cannot
 * run code. `next dev` needs eval for its refresh runtime; a production build does not.
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

function secure(response: NextResponse, csp: string, api: boolean): NextResponse {
  response.headers.set('Content-Security-Policy', csp);
  response.headers.set('X-Content-Type-Options', 'nosniff');
  response.headers.set('X-Frame-Options', 'DENY');
  response.headers.set('Referrer-Policy', 'same-origin');
  if (api) response.headers.set('Cache-Control', 'no-store');
  return response;
}

function refuse(status: number, code: string, message: string, csp: string, headers: Record<string, string> = {}) {
  const response = NextResponse.json({ error: { code, message } }, { status, headers });
  return secure(response, csp, true);
}

export function proxy(request: NextRequest) {
  const nonce = btoa(crypto.randomUUID());
  const csp = contentSecurityPolicy(nonce);
  const { pathname } = request.nextUrl;
  const api = pathname.startsWith('/api/');

  if (!METHODS.includes(request.method)) {
    return refuse(405, 'method_not_allowed', `${request.method} is not a method this app answers.`, csp, { Allow: METHODS.join(', ') });
  }
  if (Number(request.headers.get('content-length') ?? 0) > MAX_BODY_BYTES) {
    return refuse(413, 'payload_too_large', 'The request is too large: at most 1 MB.', csp);
  }
  if (!api && pathname !== '/sign-in' && !request.cookies.has('pg_session')) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = '';
    return secure(NextResponse.redirect(url), csp, false);
  }
  // The framework reads the nonce from the request's own CSP header and puts it on its scripts.
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('Content-Security-Policy', csp);
  return secure(NextResponse.next({ request: { headers } }), csp, api);
}

export const config = {
  // Static build files carry their headers from next.config.ts; everything else passes here.
  matcher: ['/((?!_next/static|_next/image).*)'],
};
