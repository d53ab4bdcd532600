import { z } from 'zod';
import {
  EMAIL_MAX,
  emailAddress,
  multiLine,
  objectError,
  optionalEmailAddress,
  optionalWholeNumber,
  singleLine,
  wholeNumber,
} from '@/lib/validations/text';

function messages(schema: z.ZodType, input: unknown): string[] {
  const result = schema.safeParse(input);
  if (result.success) throw new Error(`expected a refusal for ${JSON.stringify(input)}`);
  return result.error.issues.map((i) => i.message);
}

// Every C0 control, DEL and every C1 control (Unicode's Cc category, U+0000–U+001F and U+007F–U+009F).
const C0 = Array.from({ length: 0x20 }, (_, i) => String.fromCharCode(i));
const C1 = Array.from({ length: 0x21 }, (_, i) => String.fromCharCode(0x7f + i));
const LINE_BREAKS = ['\t', '\n', '\r'];

describe('singleLine', () => {
  const name = singleLine({ label: 'The site name', max: 160, required: 'Enter the site name.' });

  it('trims and accepts ordinary text, including letters outside ASCII and paired surrogates (emoji)', () => {
    expect(name.parse('  Øster Allé 3 ')).toBe('Øster Allé 3');
    expect(name.parse('Café 🔥')).toBe('Café 🔥');
  });

  it('refuses every control character, C0 and C1, inside the text, with the field named', () => {
    for (const c of [...C0, ...C1]) {
      expect(messages(name, `North${c}side`), `U+${c.charCodeAt(0).toString(16)}`).toEqual([
        'The site name cannot contain control characters.',
      ]);
    }
  });

  it('refuses lone surrogates, high or low, but not a pair', () => {
    for (const bad of ['a\uD800', '\uD800b', 'a\uDC00', '\uDC00\uD800', '\uDBFF']) {
      expect(messages(name, bad)).toEqual(['The site name contains a broken character; type it again.']);
    }
    expect(name.parse('\uD83D\uDE00')).toBe('😀');
  });

  it('says "at most N characters" for a long value, never the empty message', () => {
    expect(name.parse('n'.repeat(160))).toHaveLength(160);
    expect(messages(name, 'n'.repeat(161))).toEqual(['The site name is at most 160 characters.']);
    expect(messages(name, 'n'.repeat(1_000_000))).toEqual(['The site name is at most 160 characters.']);
  });

  it('counts the length after trimming', () => {
    expect(name.parse(`  ${'n'.repeat(160)}  `)).toHaveLength(160);
  });

  it('refuses empty, blank and missing values with the required message, and other types as "must be text"', () => {
    expect(messages(name, '')).toEqual(['Enter the site name.']);
    expect(messages(name, '   ')).toEqual(['Enter the site name.']);
    expect(messages(name, undefined)).toEqual(['Enter the site name.']);
    expect(messages(name, null)).toEqual(['Enter the site name.']);
    for (const other of [42, true, [], {}, ['x']]) expect(messages(name, other)).toEqual(['The site name must be text.']);
  });

  it('gives one message for a value that is both too long and holds a control character', () => {
    expect(messages(name, `${'n'.repeat(200)}\u0000`)).toEqual(['The site name cannot contain control characters.']);
  });

  it('allows the empty string when not required, and keeps surrounding space when trim is off', () => {
    const optional = singleLine({ label: 'A check', max: 300, trim: false });
    expect(optional.parse('')).toBe('');
    expect(optional.parse(' as sent ')).toBe(' as sent ');
    expect(messages(optional, ' tab\t')).toEqual(['A check cannot contain control characters.']);
  });
});

describe('multiLine', () => {
  const notes = multiLine({ label: 'The repair notes', max: 4000, required: 'Describe the repair.' });

  it('keeps tabs and line breaks inside the text', () => {
    expect(notes.parse('Cleaned the rod.\r\nReplaced\tthe igniter.\n')).toBe('Cleaned the rod.\r\nReplaced\tthe igniter.');
  });

  it('refuses every other control character', () => {
    for (const c of [...C0, ...C1].filter((c) => !LINE_BREAKS.includes(c))) {
      expect(messages(notes, `a${c}b`), `U+${c.charCodeAt(0).toString(16)}`).toEqual([
        'The repair notes cannot contain control characters.',
      ]);
    }
  });

  it('words its length limit as "at most N characters"', () => {
    expect(messages(notes, 'x'.repeat(4001))).toEqual(['The repair notes is at most 4000 characters.']);
  });
});

describe('emailAddress', () => {
  const email = emailAddress({ label: 'The e-mail address', required: 'Enter an e-mail address.' });
  // RFC 5321 §4.5.3.1.3: a forward path is at most 256 octets with its angle brackets, so 254 for the address.
  const atLength = (n: number) => `${'a'.repeat(n - '@example.test'.length)}@example.test`;

  it('is limited at 254 characters by the RFC 5321 path limit', () => {
    expect(EMAIL_MAX).toBe(254);
  });

  it('accepts 254 characters and refuses 255 with its own message', () => {
    expect(email.parse(atLength(254))).toHaveLength(254);
    expect(messages(email, atLength(255))).toEqual(['The e-mail address is at most 254 characters.']);
  });

  it('refuses a 3,000-character address by its length alone, without throwing', () => {
    const long = `${'a'.repeat(3000)}@example.test`;
    expect(() => email.safeParse(long)).not.toThrow();
    expect(messages(email, long)).toEqual(['The e-mail address is at most 254 characters.']);
  });

  it('trims and lower-cases, then checks the format', () => {
    expect(email.parse('  Ada@Example.TEST ')).toBe('ada@example.test');
    expect(messages(email, 'ada-at-example.test')).toEqual(['Enter a valid e-mail address.']);
    expect(messages(email, '')).toEqual(['Enter a valid e-mail address.']);
  });

  it('refuses control characters in words, and a missing or non-text value', () => {
    expect(messages(email, 'ada\u0000@example.test')).toEqual(['The e-mail address cannot contain control characters.']);
    expect(messages(email, undefined)).toEqual(['Enter an e-mail address.']);
    expect(messages(email, 7)).toEqual(['The e-mail address must be text.']);
  });
});

describe('optionalEmailAddress', () => {
  const email = optionalEmailAddress({ label: 'The customer e-mail address' });

  it('reads missing, null, empty and blank as null', () => {
    for (const none of [undefined, null, '', '   ']) expect(email.parse(none)).toBeNull();
  });

  it('accepts its own output (null), since forms send what the resolver gave back', () => {
    expect(email.parse(email.parse(''))).toBeNull();
  });

  it('still checks a given address: format, 254 characters, control characters, type', () => {
    expect(email.parse('Owner@Example.TEST')).toBe('owner@example.test');
    expect(messages(email, 'nope')).toEqual(['Enter a valid e-mail address.']);
    expect(messages(email, `${'a'.repeat(1_000_000)}@example.test`)).toEqual(['The customer e-mail address is at most 254 characters.']);
    expect(messages(email, 'a\u001b@example.test')).toEqual(['The customer e-mail address cannot contain control characters.']);
    expect(messages(email, ['a@example.test'])).toEqual(['The customer e-mail address must be text.']);
  });
});

describe('wholeNumber', () => {
  const va = wholeNumber({ label: 'The rating', min: 10, max: 500, required: 'Enter the rating.' });

  it('accepts a JSON number and a string of plain digits', () => {
    expect(va.parse(40)).toBe(40);
    expect(va.parse('40')).toBe(40);
    expect(va.parse(' 40 ')).toBe(40);
    expect(va.parse('040')).toBe(40);
  });

  it('refuses hex, exponent, Infinity, separators and signs in a string as "not a number"', () => {
    for (const bad of [
      '0x28',
      '4e1',
      '4E1',
      'Infinity',
      '-Infinity',
      'NaN',
      '+40',
      '4_0',
      '4,0',
      '40 VA',
      '0b101000',
      '0o50',
      '.5',
      '5.',
    ]) {
      expect(messages(va, bad), bad).toEqual(['The rating must be a number written in digits, e.g. "10".']);
    }
  });

  it('refuses null, booleans, arrays and objects with a message instead of coercing them', () => {
    for (const bad of [true, false, [], [40], {}, { value: 40 }])
      expect(messages(va, bad)).toEqual(['The rating must be a number written in digits, e.g. "10".']);
    for (const none of [undefined, null, '', '  ']) expect(messages(va, none)).toEqual(['Enter the rating.']);
  });

  it('refuses fractions and values out of range, digits or number alike', () => {
    expect(messages(va, '40.5')).toEqual(['The rating must be a whole number.']);
    expect(messages(va, 40.5)).toEqual(['The rating must be a whole number.']);
    expect(messages(va, 9)).toEqual(['The rating is at least 10.']);
    expect(messages(va, '501')).toEqual(['The rating is at most 500.']);
    expect(messages(va, '9'.repeat(400))).toEqual(['The rating is at most 500.']);
    expect(messages(va, 1e20)).toEqual(['The rating is at most 500.']);
    expect(messages(va, Number.NaN)).toEqual(['The rating must be a number written in digits, e.g. "10".']);
    expect(messages(va, Number.POSITIVE_INFINITY)).toEqual(['The rating must be a number written in digits, e.g. "10".']);
  });

  it('allows a leading minus in a string only where the range goes below zero', () => {
    const offset = wholeNumber({ label: 'The offset', min: -10, max: 10 });
    expect(offset.parse('-4')).toBe(-4);
    expect(messages(va, '-40')).toEqual(['The rating must be a number written in digits, e.g. "10".']);
  });
});

describe('optionalWholeNumber', () => {
  const year = optionalWholeNumber({ label: 'The year', min: 1950, max: 2100 });

  it('reads missing, null, empty and blank as null, and accepts digits or a number', () => {
    for (const none of [undefined, null, '', ' ']) expect(year.parse(none)).toBeNull();
    expect(year.parse('2011')).toBe(2011);
    expect(year.parse(2011)).toBe(2011);
  });

  it('refuses what is not a year in digits', () => {
    for (const bad of ['0x7db', '2.011e3', true, [], {}])
      expect(messages(year, bad)).toEqual(['The year must be a number written in digits, e.g. "1950".']);
    expect(messages(year, 1900)).toEqual(['The year is at least 1950.']);
  });
});

describe('objectError', () => {
  const strict = z.strictObject({ a: z.string({ error: 'a is text.' }) }, { error: objectError('the thing') });

  it('names unknown fields, one or several', () => {
    expect(messages(strict, { a: 'x', b: 1 })).toEqual(['Unknown field in the thing: "b".']);
    expect(messages(strict, { a: 'x', b: 1, c: 2 })).toEqual(['Unknown fields in the thing: "b", "c".']);
  });

  it('names at most five unknown fields, each cut to 40 characters', () => {
    const many = Object.fromEntries(['b', 'c', 'd', 'e', 'f', 'g', 'h'].map((k) => [k, 1]));
    expect(messages(strict, { a: 'x', ...many })).toEqual(['Unknown fields in the thing: "b", "c", "d", "e", "f" and 2 more.']);
    expect(messages(strict, { a: 'x', ['k'.repeat(100_000)]: 1 })).toEqual([`Unknown field in the thing: "${'k'.repeat(40)}…".`]);
  });

  it('says what to send when the value is not an object', () => {
    for (const bad of [null, 7, 'x', [], true]) expect(messages(strict, bad)).toEqual(['Send the thing as an object of fields.']);
  });
});
