// One error type for the whole server side. Its code maps to an HTTP status in route handlers and
// to a message in server actions; a database message never reaches the client.
export type ErrorCode =
  'bad_request' | 'unauthorized' | 'forbidden' | 'not_found' | 'conflict' | 'rate_limited' | 'unavailable' | 'internal';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
};

export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fieldErrors?: FieldErrors;
  readonly headers?: Record<string, string>;

  constructor(code: ErrorCode, message: string, opts: { fieldErrors?: FieldErrors; headers?: Record<string, string> } = {}) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.fieldErrors = opts.fieldErrors;
    this.headers = opts.headers;
  }

  get status(): number {
    return STATUS[this.code];
  }
}

export const notFound = (what = 'That record') => new AppError('not_found', `${what} was not found.`);
