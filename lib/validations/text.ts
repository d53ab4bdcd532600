// Schema builders for what people type and clients send, so every field refuses the same things with
// words: control characters and broken UTF-16 (PostgreSQL refuses both, which used to surface as a
// 500), values longer than their column allows, e-mail addresses past the RFC 5321 path limit, and
// "numbers" that are not written in plain digits. Every issue carries its own message, so zod's
// generic "Invalid input" never reaches a form or an API client.
import { z } from 'zod';

// C0 controls and DEL through the C1 block. Multi-line fields keep TAB, LF and CR.
const CONTROL_CHARACTER = /[\u0000-\u001F\u007F-\u009F]/;
const CONTROL_CHARACTER_BUT_LINE_BREAKS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/;
// A high surrogate not followed by a low one, or a low one without a high one before it.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** RFC 5321 §4.5.3.1.3: a path is at most 256 octets including the angle brackets, so an address is at most 254. */
export const EMAIL_MAX = 254;
// The pattern zod's own z.email() uses, so the checks keep accepting what they accepted before.
const EMAIL_FORMAT = z.regexes.email;

export interface TextOptions {
  /** The field as the start of a sentence: "The site name", "stepId". */
  label: string;
  max: number;
  /** When the value is missing or empty, e.g. "Enter the site name." Without it the empty string is allowed. */
  required?: string;
  /** When the value is missing (undefined or null) rather than empty; defaults to `required`. */
  missing?: string;
  /** Trim surrounding white space before the checks (default true); ids and texts matched exactly keep it off. */
  trim?: boolean;
}

/** The messages every text field shares, from its label. */
function textMessages(label: string, max: number) {
  return {
    notText: `${label} must be text.`,
    control: `${label} cannot contain control characters.`,
    surrogate: `${label} contains a broken character; type it again.`,
    tooLong: `${label} is at most ${max} characters.`,
  };
}

// Lengths are refinements rather than zod's .min()/.max(): those also run after a failed type check
// on anything with a length (an array given for a name), adding a second, misleading message.
function textField(opts: TextOptions, controls: RegExp) {
  const words = textMessages(opts.label, opts.max);
  const missing = opts.missing ?? opts.required ?? `${opts.label} is required.`;
  let schema = z.string({ error: (issue) => (issue.input === undefined || issue.input === null ? missing : words.notText) });
  if (opts.trim !== false) schema = schema.trim();
  schema = schema
    .refine((v) => !controls.test(v), { error: words.control, abort: true })
    .refine((v) => !LONE_SURROGATE.test(v), { error: words.surrogate, abort: true })
    .refine((v) => v.length <= opts.max, { error: words.tooLong, abort: true });
  return opts.required ? schema.refine((v) => v.length > 0, { error: opts.required }) : schema;
}

/** One line of text: no control characters at all. */
export function singleLine(opts: TextOptions) {
  return textField(opts, CONTROL_CHARACTER);
}

/** Text that may run over several lines (complaint, repair notes): TAB, LF and CR are allowed. */
export function multiLine(opts: TextOptions) {
  return textField(opts, CONTROL_CHARACTER_BUT_LINE_BREAKS);
}

export interface SecretOptions {
  /** The field as the start of a sentence, e.g. "The password". */
  label: string;
  min: number;
  max: number;
  /** When the value is missing (undefined or null), e.g. "Enter your password." */
  missing: string;
  /** When it is shorter than `min`, e.g. "Use at least 12 characters." */
  tooShort: string;
}

/** A password: never trimmed and never stored as text (it is hashed), so only its type and length are checked. */
export function secret(opts: SecretOptions) {
  const words = textMessages(opts.label, opts.max);
  return z
    .string({ error: (issue) => (issue.input === undefined || issue.input === null ? opts.missing : words.notText) })
    .refine((v) => v.length <= opts.max, { error: words.tooLong, abort: true })
    .refine((v) => v.length >= opts.min, { error: opts.tooShort });
}

export interface EmailOptions {
  /** The field as the start of a sentence, e.g. "The customer e-mail address". */
  label: string;
  /** When the value is missing (undefined or null), e.g. "Enter your e-mail address." */
  required: string;
  /** When the value does not look like an address; "Enter a valid e-mail address." unless given. */
  invalid?: string;
}

function emailText(label: string, missing: string) {
  const words = textMessages(label, EMAIL_MAX);
  return z
    .string({ error: (issue) => (issue.input === undefined || issue.input === null ? missing : words.notText) })
    .trim()
    .toLowerCase()
    .refine((v) => !CONTROL_CHARACTER.test(v), { error: words.control, abort: true })
    .refine((v) => !LONE_SURROGATE.test(v), { error: words.surrogate, abort: true })
    .refine((v) => v.length <= EMAIL_MAX, { error: words.tooLong, abort: true });
}

/** A required e-mail address, trimmed and lower-cased; the length is checked before the format. */
export function emailAddress(opts: EmailOptions) {
  const invalid = opts.invalid ?? 'Enter a valid e-mail address.';
  // An empty field gets the format message, as the sign-in form has always said.
  return emailText(opts.label, opts.required).regex(EMAIL_FORMAT, { error: invalid });
}

/** An optional e-mail address: missing, null, empty or blank all mean "none" (null). */
export function optionalEmailAddress(opts: Omit<EmailOptions, 'required'>) {
  const invalid = opts.invalid ?? 'Enter a valid e-mail address.';
  return emailText(opts.label, '')
    .refine((v) => v === '' || EMAIL_FORMAT.test(v), { error: invalid })
    .nullish()
    .transform((v) => (v ? v : null));
}

export interface NumberOptions {
  /** The field as the start of a sentence, e.g. "The transformer rating". */
  label: string;
  min: number;
  max: number;
  /** When the value is missing, null or an empty string, e.g. "Enter the transformer rating in VA." */
  required?: string;
  /** When it is not a number written in digits (hex, exponent, words, true, [] …). */
  notNumber?: string;
  /** When it has a fractional part. */
  notWhole?: string;
  tooSmall?: string;
  tooLarge?: string;
}

function numberMessages(opts: NumberOptions) {
  return {
    required: opts.required ?? `${opts.label} is required.`,
    notNumber: opts.notNumber ?? `${opts.label} must be a number written in digits, e.g. "${Math.max(opts.min, 0)}".`,
    notWhole: opts.notWhole ?? `${opts.label} must be a whole number.`,
    tooSmall: opts.tooSmall ?? `${opts.label} is at least ${opts.min}.`,
    tooLarge: opts.tooLarge ?? `${opts.label} is at most ${opts.max}.`,
  };
}

/**
 * Reads a form string as a number: plain decimal digits, a leading minus only where the field may be
 * negative. A decimal fraction is read (so the whole-number check can name it), but not hex, exponent
 * forms, "Infinity", separators or anything else Number() would otherwise accept. An empty or blank
 * string reads as null, for the caller to refuse or keep.
 */
function readNumber(words: ReturnType<typeof numberMessages>, negative: boolean) {
  const digits = negative ? /^-?\d+(?:\.\d+)?$/ : /^\d+(?:\.\d+)?$/;
  return (value: number | string, ctx: z.RefinementCtx<number | string>): number | null => {
    if (typeof value === 'number') return value;
    const text = value.trim();
    if (text === '') return null;
    if (!digits.test(text)) {
      ctx.issues.push({ code: 'custom', message: words.notNumber, input: value });
      return z.NEVER;
    }
    // Digits only, so Number() reads exactly them; an absurdly long run of digits is simply too large.
    const n = Number(text);
    return Number.isFinite(n) ? n : Number.MAX_VALUE;
  };
}

function numberOrDigits(words: ReturnType<typeof numberMessages>) {
  return z.union([z.number(), z.string()], {
    error: (issue) => (issue.input === undefined || issue.input === null ? words.required : words.notNumber),
  });
}

function bounds(opts: NumberOptions, words: ReturnType<typeof numberMessages>) {
  return (
    z
      .number({ error: words.notNumber })
      // The range first: zod's whole-number check also refuses integers beyond 2^53, which are simply too large here.
      .max(opts.max, { error: words.tooLarge, abort: true })
      .min(opts.min, { error: words.tooSmall, abort: true })
      .int({ error: words.notWhole })
  );
}

/** A required whole number: a JSON number, or a string of digits from a form field. */
export function wholeNumber(opts: NumberOptions) {
  const words = numberMessages(opts);
  const read = readNumber(words, opts.min < 0);
  return numberOrDigits(words)
    .transform((value, ctx) => {
      const n = read(value, ctx);
      if (n !== null) return n;
      ctx.issues.push({ code: 'custom', message: words.required, input: value });
      return z.NEVER;
    })
    .pipe(bounds(opts, words));
}

/** An optional whole number: missing, null, an empty or blank string all mean "none" (null). */
export function optionalWholeNumber(opts: Omit<NumberOptions, 'required'>) {
  const words = numberMessages(opts);
  return numberOrDigits(words)
    .transform(readNumber(words, opts.min < 0))
    .pipe(bounds(opts, words).nullable())
    .nullish()
    .transform((n) => n ?? null);
}

/** A client's field name, quoted, and cut short: the message should not echo a megabyte back. */
function quoteKey(key: string) {
  return JSON.stringify(key.length > 40 ? `${key.slice(0, 40)}…` : key);
}

/** The message for an object that is not one, or that carries fields it does not know (the first five named). */
export function objectError(what: string) {
  return (issue: { code?: string; keys?: string[] }) => {
    if (issue.code !== 'unrecognized_keys' || !issue.keys) return `Send ${what} as an object of fields.`;
    const named = issue.keys.slice(0, 5).map(quoteKey).join(', ');
    const more = issue.keys.length > 5 ? ` and ${issue.keys.length - 5} more` : '';
    return `Unknown field${issue.keys.length === 1 ? '' : 's'} in ${what}: ${named}${more}.`;
  };
}
