import { NextResponse, type NextRequest } from 'next/server';

// Redirects only: a visitor without a session cookie goes to sign-in. The real checks (session
// version, active flag, role) run in every page, action and handler through lib/server/guard.ts.
export function proxy(request: NextRequest) {
  const hasCookie = request.cookies.has('pg_session');
  const { pathname } = request.nextUrl;
  if (!hasCookie && pathname !== '/sign-in') {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = '';
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = {
  matcher: ['/((?!api|_next|favicon.ico|sign-in).*)'],
};
