import 'server-only';
import { redirect } from 'next/navigation';
import { NextResponse } from 'next/server';
import { z, type ZodType } from 'zod';
import { getSessionUser, type UserWithCompany } from '@/db/users';
import { AppError, type FieldErrors } from '@/lib/errors';
import type { Role } from '@/lib/roles';
import { getSession } from '@/lib/server/session';

export type CurrentUser = UserWithCompany;

/**
 * The one check behind every server action, route handler and page: a session whose user exists,
 * is active, and whose session version is current; and, when given, one of `roles`.
 */
export async function requireUser({ roles }: { roles?: readonly Role[] } = {}): Promise<CurrentUser> {
  const session = await getSession();
  if (!session.userId) throw new AppError('unauthorized', 'Sign in to continue.');
  const user = await getSessionUser({ id: session.userId });
  if (!user || !user.active || user.sessionVersion !== session.version) {
    throw new AppError('unauthorized', 'Your session has ended. Sign in again.');
  }
  if (roles && !roles.includes(user.role)) {
    throw new AppError('forbidden', 'Your role does not allow this.');
  }
  return user;
}

/** For server components: send the visitor to sign in, or home when the role may not open the page. */
export async function requirePageUser({ roles }: { roles?: readonly Role[] } = {}): Promise<CurrentUser> {
  try {
    return await requireUser({ roles });
  } catch (error) {
    if (error instanceof AppError && error.code === 'forbidden') redirect('/?refused=1');
    if (error instanceof AppError && error.code === 'unauthorized') redirect('/sign-in');
    throw error;
  }
}

export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const flat = z.flattenError(error);
  const fieldErrors: FieldErrors = {};
  for (const [key, messages] of Object.entries(flat.fieldErrors as Record<string, string[] | undefined>)) {
    if (messages?.length) fieldErrors[key] = messages;
  }
  if (flat.formErrors.length) fieldErrors._form = flat.formErrors;
  return fieldErrors;
}

export function parseOrThrow<T>(schema: ZodType<T>, input: unknown, what = 'The request'): T {
  const result = schema.safeParse(input);
  if (!result.success) {
    const fieldErrors = zodFieldErrors(result.error);
    const first = Object.values(fieldErrors)[0]?.[0];
    throw new AppError('bad_request', first ? `${what} is not valid: ${first}` : `${what} is not valid.`, { fieldErrors });
  }
  return result.data;
}

export function errorResponse(error: unknown): NextResponse {
  if (error instanceof AppError) {
    return NextResponse.json(
      { error: { code: error.code, message: error.message, ...(error.fieldErrors ? { fieldErrors: error.fieldErrors } : {}) } },
      { status: error.status, headers: error.headers },
    );
  }
  console.error(error);
  return NextResponse.json(
    { error: { code: 'internal', message: 'Something went wrong on our side. Nothing was changed; try again.' } },
    { status: 500 },
  );
}

type RouteContext = { params: Promise<Record<string, string | string[]>> };

interface RouteOptions<B> {
  /** Omit for public routes (sign-in, health). */
  roles?: readonly Role[] | 'any';
  body?: ZodType<B>;
}

interface RouteArgs<B> {
  request: Request;
  params: Record<string, string>;
  user: CurrentUser;
  body: B;
}

/**
 * Wraps a route handler: session and role check, JSON body parsed and validated, errors mapped to
 * `{ error: { code, message, fieldErrors? } }` with the right status. A handler returns a Response
 * or data to send as JSON with 200.
 */
export function route<B = undefined>(options: RouteOptions<B>, handler: (args: RouteArgs<B>) => Promise<Response | unknown>) {
  return async (request: Request, context: RouteContext): Promise<Response> => {
    try {
      const user =
        options.roles === undefined
          ? (undefined as unknown as CurrentUser)
          : await requireUser(options.roles === 'any' ? {} : { roles: options.roles });
      let body = undefined as B;
      if (options.body) {
        let raw: unknown;
        try {
          raw = await request.json();
        } catch {
          throw new AppError('bad_request', 'The request body must be JSON.');
        }
        body = parseOrThrow(options.body, raw);
      }
      const params = Object.fromEntries(
        Object.entries((await context?.params) ?? {}).map(([k, v]) => [k, Array.isArray(v) ? v.join('/') : v]),
      );
      const result = await handler({ request, params, user, body });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

export type ActionResult<T> = { ok: true; data: T } | { ok: false; message: string; fieldErrors?: FieldErrors };

/** Wraps a server action the same way: session, role, zod, one result shape. */
export function action<I, T>(
  options: { roles?: readonly Role[]; schema: ZodType<I> },
  handler: (args: { user: CurrentUser; input: I }) => Promise<T>,
) {
  return async (raw: unknown): Promise<ActionResult<T>> => {
    try {
      const user = await requireUser({ roles: options.roles });
      const input = parseOrThrow(options.schema, raw, 'The form');
      return { ok: true, data: await handler({ user, input }) };
    } catch (error) {
      if (error instanceof AppError) return { ok: false, message: error.message, fieldErrors: error.fieldErrors };
      // redirect() and notFound() signal by throwing; let Next handle them.
      if (error && typeof error === 'object' && 'digest' in error) throw error;
      console.error(error);
      return { ok: false, message: 'Something went wrong on our side. Nothing was changed; try again.' };
    }
  };
}

export function clientAddress(request: Request): string {
  const forwarded = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
  return forwarded || request.headers.get('x-real-ip') || 'unknown';
}
