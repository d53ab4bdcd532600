import 'server-only';
import { headers as nextHeaders } from 'next/headers';
import { notFound, redirect } from 'next/navigation';
import { NextResponse } from 'next/server';
import { z, type ZodType } from 'zod';
import { AppError, type ErrorCode, type FieldErrors } from '@/lib/errors';
import { POLICY, reachOf, type Access, type OperationName, type Scope } from '@/lib/policy';
import { requireUser, type CurrentUser } from '@/lib/server/guard';
import type { ActionResult } from '@/lib/validations/api';

// Operations: each is declared once — its name (its row in lib/policy.ts), input schema, output
// schema and handler — and reached through thin adapters made from that declaration: `routeOf` for
// a route handler, `actionOf` for a server action, `pageScope` for a server component. The adapters
// do the same checks in the same order: where the request comes from, the session, the role and the
// reach (POLICY), the input, the handler, the output. So a handler and an action can never disagree.

/** Who sent the request, as far as the handlers need to know. */
export interface ClientInfo {
  address: string;
  userAgent: string | null;
}

interface Context<I> {
  input: I;
  client: ClientInfo;
}
export interface SignedInContext<I> extends Context<I> {
  user: CurrentUser;
  scope: Scope;
}
export interface PublicContext<I> extends Context<I> {
  user: null;
}

export interface Operation<In extends ZodType = ZodType, Out extends ZodType = ZodType> {
  name: OperationName;
  input: In;
  output: Out;
  isPublic: boolean;
  /** The input field that holds the form or body the user filled in, so field errors are named as in it. */
  fieldsUnder?: string;
  run(ctx: SignedInContext<z.output<In>> | PublicContext<z.output<In>>): Promise<z.input<Out>>;
}

export type OperationOutput<O> = O extends Operation<ZodType, infer Out> ? z.output<Out> : never;

export function defineOperation<In extends ZodType, Out extends ZodType>(def: {
  name: OperationName;
  input: In;
  output: Out;
  fieldsUnder?: string;
  handler: (ctx: SignedInContext<z.output<In>>) => Promise<z.input<Out>>;
}): Operation<In, Out> {
  if ((POLICY[def.name] as Access).public) throw new Error(`${def.name} is public in the policy: declare it with definePublicOperation`);
  return {
    name: def.name,
    input: def.input,
    output: def.output,
    isPublic: false,
    fieldsUnder: def.fieldsUnder,
    run: def.handler as Operation<In, Out>['run'],
  };
}

export function definePublicOperation<In extends ZodType, Out extends ZodType>(def: {
  name: OperationName;
  input: In;
  output: Out;
  handler: (ctx: PublicContext<z.output<In>>) => Promise<z.input<Out>>;
}): Operation<In, Out> {
  if (!(POLICY[def.name] as Access).public)
    throw new Error(`${def.name} needs a signed-in user in the policy: declare it with defineOperation`);
  return { name: def.name, input: def.input, output: def.output, isPublic: true, run: def.handler as Operation<In, Out>['run'] };
}

// ── The checks every adapter runs ───────────────────────────────────────────────────────────────

/** The user and the rows they reach for `name`: 401 without a live session, 403 for a role the policy does not list. */
export async function authorize(name: OperationName): Promise<{ user: CurrentUser; scope: Scope }> {
  const user = await requireUser();
  const reach = reachOf(name, user.role);
  if (!reach) throw new AppError('forbidden', 'Your role does not allow this.');
  return { user, scope: { companyId: user.companyId, userId: user.id, reach } };
}

export function zodFieldErrors(error: z.ZodError, under?: string): FieldErrors {
  const fieldErrors: FieldErrors = {};
  for (const issue of error.issues) {
    const path = under && issue.path[0] === under ? issue.path.slice(1) : issue.path;
    const key = path.length ? String(path[0]) : '_form';
    (fieldErrors[key] ??= []).push(issue.message);
  }
  return fieldErrors;
}

export function parseInput<S extends ZodType>(schema: S, raw: unknown, under?: string): z.output<S> {
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  const fieldErrors = zodFieldErrors(result.error, under);
  const first = result.error.issues[0]?.message;
  throw new AppError('bad_request', first ?? 'The request is not valid.', { fieldErrors });
}

async function execute<In extends ZodType, Out extends ZodType>(
  op: Operation<In, Out>,
  raw: unknown,
  client: ClientInfo,
): Promise<{ input: z.output<In>; output: z.output<Out> }> {
  let result: z.input<Out>;
  let input: z.output<In>;
  if (op.isPublic) {
    input = parseInput(op.input, raw, op.fieldsUnder);
    result = await op.run({ user: null, input, client });
  } else {
    // Who first, then what: an anonymous or refused caller learns nothing from input errors.
    const { user, scope } = await authorize(op.name);
    input = parseInput(op.input, raw, op.fieldsUnder);
    result = await op.run({ user, scope, input, client });
  }
  const out = op.output.safeParse(result);
  if (!out.success) {
    console.error(`${op.name}: output does not match its schema`, out.error.issues.slice(0, 5));
    throw new AppError('internal', 'Something went wrong on our side. Nothing was changed; try again.');
  }
  return { input, output: out.data };
}

/** Database failures that mean "busy, try again" rather than "broken". */
const RETRYABLE_PG = new Set([
  '55P03', // lock_not_available (lock_timeout)
  '57014', // query_canceled (statement_timeout)
  '53300', // too_many_connections
  '57P03', // cannot_connect_now
  '40001', // serialization_failure
  '40P01', // deadlock_detected
]);
export const RETRY_AFTER_SECONDS = 1;

/** Any thrown value as the AppError the client sees; nothing of a database message leaks. */
export function toAppError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  const e = error as { name?: string; code?: string; message?: string };
  const busy = () =>
    new AppError('unavailable', 'The server is busy. Nothing was changed; try again in a moment.', {
      headers: { 'Retry-After': String(RETRY_AFTER_SECONDS) },
    });
  if (e?.name === 'KnexTimeoutError' || (e?.code && RETRYABLE_PG.has(e.code))) return busy();
  if (
    e?.code === 'ECONNREFUSED' ||
    e?.code === 'ECONNRESET' ||
    /timeout exceeded when trying to connect|Connection terminated/i.test(e?.message ?? '')
  ) {
    return busy();
  }
  // The schemas refuse these first; this is the net under them.
  if (e?.code === '22P05' || e?.code === '22021') return new AppError('bad_request', 'The text contains characters that cannot be stored.');
  console.error(error);
  return new AppError('internal', 'Something went wrong on our side. Nothing was changed; try again.');
}

export function errorResponse(error: unknown): NextResponse {
  const e = toAppError(error);
  return NextResponse.json(
    { error: { code: e.code, message: e.message, ...(e.fieldErrors ? { fieldErrors: e.fieldErrors } : {}) } },
    { status: e.status, headers: { 'Cache-Control': 'no-store', ...e.headers } },
  );
}

/**
 * Unsafe requests must come from our own pages. A browser says where a request comes from in
 * Sec-Fetch-Site (every current browser) or Origin; a cross-site one is refused. A request with
 * neither header does not come from a browser, so no victim's cookies can be riding on it.
 */
export function assertSameOrigin(headers: Headers): void {
  const refuse = () => {
    throw new AppError('forbidden', 'This request came from another site and was refused. Use Proving Ground from its own address.');
  };
  const site = headers.get('sec-fetch-site');
  if (site) {
    if (site !== 'same-origin' && site !== 'none') refuse();
    return;
  }
  const origin = headers.get('origin');
  if (origin === null) return;
  let host: string;
  try {
    host = new URL(origin).host;
  } catch {
    return refuse();
  }
  const allowed = new Set([headers.get('x-forwarded-host'), headers.get('host')].filter(Boolean));
  if (process.env.APP_URL) {
    try {
      allowed.add(new URL(process.env.APP_URL).host);
    } catch {
      // An APP_URL that is not a URL adds nothing.
    }
  }
  if (!allowed.has(host)) refuse();
}

export const MAX_BODY_BYTES = 1024 * 1024;

/** The JSON body, at most 1 MB, of a request that says it is JSON; `undefined` when there is none. */
async function readJsonBody(request: Request): Promise<unknown> {
  const declared = Number(request.headers.get('content-length') ?? '0');
  if (declared > MAX_BODY_BYTES) throw tooLarge();
  if (!request.body) return undefined;
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > MAX_BODY_BYTES) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  if (size === 0) return undefined;
  const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  if (type !== 'application/json') {
    throw new AppError('forbidden', 'Send the request body as JSON (Content-Type: application/json).');
  }
  try {
    return JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(Buffer.concat(chunks)));
  } catch {
    throw new AppError('bad_request', 'The request body must be JSON.');
  }
}

const tooLarge = () => new AppError('payload_too_large', 'The request is too large: at most 1 MB.');

function clientOf(headers: Headers): ClientInfo {
  const forwarded = headers.get('x-forwarded-for')?.split(',')[0]?.trim();
  return { address: forwarded || headers.get('x-real-ip') || 'unknown', userAgent: headers.get('user-agent') };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

interface RouteOptions<O> {
  /** Path parameters, by the name in the folder (`[id]`), to the input field they fill. */
  params?: Record<string, string>;
  /** Take the query string into the input (GET lists, DELETE with a condition). */
  query?: boolean;
  /** Put the JSON body under this input field instead of merging it in (PATCH /api/users/{id}: the body is the patch). */
  bodyAs?: string;
  /** The status of a success: a number, or decided from the output (health: 200 or 503). */
  status?: number | ((output: O) => number);
}

type RouteContext = { params: Promise<Record<string, string | string[]>> };

/** A route handler for `op`: JSON in, JSON out, `{ error: { code, message, fieldErrors? } }` on failure. */
export function routeOf<In extends ZodType, Out extends ZodType>(op: Operation<In, Out>, options: RouteOptions<z.output<Out>> = {}) {
  return async (request: Request, context: RouteContext): Promise<Response> => {
    try {
      const unsafe = !SAFE_METHODS.has(request.method);
      if (unsafe) assertSameOrigin(request.headers);
      const body = unsafe ? await readJsonBody(request) : undefined;
      if (body !== undefined && (typeof body !== 'object' || body === null || Array.isArray(body))) {
        throw new AppError('bad_request', 'The request body must be a JSON object.');
      }
      const input: Record<string, unknown> = {};
      if (options.query) {
        for (const [key, value] of new URL(request.url).searchParams) if (value !== '') input[key] = value;
      }
      if (options.bodyAs) {
        if (body !== undefined) input[options.bodyAs] = body;
      } else Object.assign(input, body);
      const params = (await context?.params) ?? {};
      for (const [name, field] of Object.entries(options.params ?? {})) {
        const value = params[name];
        input[field] = Array.isArray(value) ? value.join('/') : value;
      }
      const { output } = await execute(op, input, clientOf(request.headers));
      const status = typeof options.status === 'function' ? options.status(output) : (options.status ?? 200);
      if (status === 204) return new Response(null, { status, headers: { 'Cache-Control': 'no-store' } });
      return NextResponse.json(output ?? null, { status, headers: { 'Cache-Control': 'no-store' } });
    } catch (error) {
      return errorResponse(error);
    }
  };
}

interface ActionOptions<I, O> {
  /** Pages whose server-rendered data the action changes (for the router to fetch again); `layout:/x` for a whole layout. */
  revalidate?: (input: I, output: O) => string[];
}

/**
 * A server action for `op`. It never throws for a refusal: it returns
 * `{ ok: false, code, message, fieldErrors? }` with the code the route would answer as a status.
 */
export function actionOf<In extends ZodType, Out extends ZodType>(
  op: Operation<In, Out>,
  options: ActionOptions<z.output<In>, z.output<Out>> = {},
  // What reaches a server action is whatever the network sent, so it is typed as such and parsed.
): (raw: unknown) => Promise<ActionResult<z.output<Out>>> {
  return async (raw) => {
    try {
      const headers = await nextHeaders();
      assertSameOrigin(headers);
      const { input, output } = await execute(op, raw, clientOf(headers));
      if (options.revalidate) {
        const { revalidatePath } = await import('next/cache');
        for (const path of options.revalidate(input, output)) {
          if (path.startsWith('layout:')) revalidatePath(path.slice('layout:'.length), 'layout');
          else revalidatePath(path);
        }
      }
      return { ok: true, data: output };
    } catch (error) {
      // redirect() and notFound() signal by throwing; let Next handle them.
      if (error && typeof error === 'object' && 'digest' in error && !(error instanceof AppError)) throw error;
      const e = toAppError(error);
      const retryAfter = e.headers?.['Retry-After'] ? Number(e.headers['Retry-After']) : undefined;
      return {
        ok: false,
        code: e.code as ErrorCode,
        message: e.message,
        ...(e.fieldErrors ? { fieldErrors: e.fieldErrors } : {}),
        ...(retryAfter ? { retryAfter } : {}),
      };
    }
  };
}

/**
 * For server components: the user and their scope for the operation whose data the page shows.
 * Without a session the visitor goes to sign-in; a role the policy does not list goes home.
 */
export async function pageScope(name: OperationName): Promise<{ user: CurrentUser; scope: Scope }> {
  try {
    return await authorize(name);
  } catch (error) {
    if (error instanceof AppError && error.code === 'forbidden') redirect('/?refused=1');
    if (error instanceof AppError && error.code === 'unauthorized') redirect('/sign-in');
    throw error;
  }
}

/** A page's read: a row that is not there (or not the user's) becomes the 404 page, with status 404. */
export async function orNotFound<T>(read: Promise<T>): Promise<T> {
  try {
    return await read;
  } catch (error) {
    if (error instanceof AppError && error.code === 'not_found') notFound();
    throw error;
  }
}
