// One error type for the whole server side. Its code maps to an HTTP status in route handlers and
// travels as `code` in a server action's result; a database message never reaches the client.
export const ERROR_STATUS = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  /** Well-formed, but what it names cannot be done as it stands (a tree with validation problems). */
  unprocessable: 422,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

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
    return ERROR_STATUS[this.code];
  }
}

export const notFound = (what = 'That record') => new AppError('not_found', `${what} was not found.`);
