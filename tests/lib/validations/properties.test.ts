// Property tests of every input schema: whatever a client sends (any JSON, the odder values a server
// action can carry, or a valid body with fields swapped for hostile values), safeParse answers
// without throwing; a refusal has one worded message per field, never one of zod's defaults; and
// what is accepted holds no text PostgreSQL would refuse (NUL, a lone surrogate) and parses again
// to itself.
import fc from 'fast-check';
import { z } from 'zod';
import { signInSchema } from '@/lib/validations/auth';
import {
  answerSchema,
  assignCallSchema,
  callFilterSchema,
  callSchema,
  closeCallSchema,
  reopenCallSchema,
  repairSchema,
  signOffSchema,
  siteSchema,
  startDiagnosisSchema,
  unitSchema,
} from '@/lib/validations/field';
import { companySettingsSchema, createUserSchema, updateUserSchema, uuidSchema } from '@/lib/validations/users';

const RUNS = 300;
const ID = '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a01';

// zod's own wording: "Invalid input: expected …", "Invalid UUID", "Invalid option …", "Too big: …",
// "Too small: …", "Unrecognized key(s) …". None of it may reach a person.
const ZOD_DEFAULT = /Invalid input|^Invalid |^Too (big|small)|^Unrecognized key/;
const NUL_OR_LONE_SURROGATE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Ordinary text with a C0/C1 control character or a lone surrogate somewhere inside it. */
const tainted = fc
  .tuple(
    fc.string({ maxLength: 20 }),
    fc.oneof(
      fc.integer({ min: 0, max: 0x1f }).map((c) => String.fromCharCode(c)),
      fc.integer({ min: 0x7f, max: 0x9f }).map((c) => String.fromCharCode(c)),
      fc.integer({ min: 0xd800, max: 0xdfff }).map((c) => String.fromCharCode(c)),
    ),
    fc.string({ maxLength: 20 }),
  )
  .map(([a, bad, b]) => `${a}${bad}${b}`);

const hostile = fc.oneof(
  { weight: 3, arbitrary: tainted },
  fc.jsonValue(),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'binary-ascii', maxLength: 400 }),
  {
    weight: 2,
    arbitrary: fc.constantFrom<unknown>(
      '\u0000',
      'a\u0000b',
      '\u0007',
      '\u009f',
      '\uD800',
      'x\uDC00',
      ' ',
      '',
      'x'.repeat(5000),
      `${'a'.repeat(3000)}@example.test`,
      '0x28',
      '4e1',
      'Infinity',
      '-1',
      '40.5',
      null,
      true,
      false,
      [],
      {},
      -1,
      0,
      1e308,
      Number.NaN,
      Number.POSITIVE_INFINITY,
      -0,
    ),
  },
  fc.anything({
    withBigInt: true,
    withDate: true,
    withMap: true,
    withSet: true,
    withNullPrototype: true,
    withTypedArray: true,
    withSparseArray: true,
    withBoxedValues: true,
    withObjectString: true,
    maxDepth: 2,
  }),
);

/** Arbitrary input, or the valid body with some of its fields swapped for hostile values (and maybe an unknown field). */
function inputs(valid: Record<string, unknown>) {
  const keys = Object.keys(valid);
  const swapped = fc
    .record({
      swaps: fc.subarray(keys),
      values: fc.array(hostile, { minLength: keys.length, maxLength: keys.length }),
      drop: fc.subarray(keys, { maxLength: Math.min(2, keys.length) }),
      extra: fc.option(fc.tuple(fc.string({ maxLength: 10 }), hostile), { nil: undefined }),
    })
    .map(({ swaps, values, drop, extra }) => {
      const body: Record<string, unknown> = { ...valid };
      swaps.forEach((k, i) => (body[k] = values[i]));
      for (const k of drop) delete body[k];
      if (extra) body[extra[0]] = extra[1];
      return body;
    });
  // One field at a time, so a bad value is not hidden behind another field's refusal.
  const single = fc.tuple(fc.constantFrom(...keys), hostile).map(([k, v]) => ({ ...valid, [k]: v }));
  return fc.oneof({ weight: 1, arbitrary: hostile }, { weight: 3, arbitrary: swapped }, { weight: 3, arbitrary: single });
}

function strings(value: unknown, skip: string[], out: string[] = []): string[] {
  if (typeof value === 'string') out.push(value);
  else if (Array.isArray(value)) for (const v of value) strings(v, skip, out);
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) if (!skip.includes(k)) strings(v, skip, out);
  }
  return out;
}

function checkAnswer(schema: z.ZodType, input: unknown, skip: string[]) {
  const result = schema.safeParse(input);
  if (result.success) {
    for (const s of strings(result.data, skip)) expect(s).not.toMatch(NUL_OR_LONE_SURROGATE);
    // A form sends the resolver's output on to the server action, which parses it again.
    expect(schema.parse(result.data)).toEqual(result.data);
    return;
  }
  const perPath = new Map<string, string[]>();
  for (const issue of result.error.issues) {
    expect(typeof issue.message).toBe('string');
    expect(issue.message.length).toBeGreaterThan(0);
    expect(issue.message).not.toMatch(ZOD_DEFAULT);
    const key = issue.path.map(String).join('.');
    perPath.set(key, [...(perPath.get(key) ?? []), issue.message]);
  }
  for (const [path, messages] of perPath) expect(messages, `messages at "${path}"`).toHaveLength(1);
}

interface Case {
  schema: z.ZodType;
  valid: Record<string, unknown>;
  /** Fields that are hashed rather than stored as text. */
  secret?: string[];
}

const CASES: Record<string, Case> = {
  siteSchema: { schema: siteSchema, valid: { name: 'Oduya residence', address: '41 Larchmont Rise', contactEmail: 'owner@example.test' } },
  unitSchema: {
    schema: unitSchema,
    valid: {
      siteId: ID,
      label: 'Basement furnace',
      ignition: 'two-rod',
      fuel: 'lp',
      controlSupply: '24v',
      transformerVa: '40',
      installYear: '2011',
    },
  },
  callSchema: { schema: callSchema, valid: { unitId: ID, complaint: 'No heat', technicianId: ID } },
  callFilterSchema: { schema: callFilterSchema, valid: { status: 'open', technician: 'me' } },
  startDiagnosisSchema: { schema: startDiagnosisSchema, valid: { treeVersionId: ID } },
  answerSchema: {
    schema: answerSchema,
    valid: { clientId: ID, stepId: 'flame-signal', text: '4.2', unit: 'µA', choice: 'yes', confirmed: true },
  },
  repairSchema: {
    schema: repairSchema,
    valid: {
      repairNotes: 'Cleaned the rod',
      cycles: '3',
      flameSignal: '4.2 µA',
      checks: [{ text: 'Flame holds', done: true }],
      notes: 'Ok',
    },
  },
  closeCallSchema: { schema: closeCallSchema, valid: { outcome: 'referred', reason: 'Part on order' } },
  reopenCallSchema: { schema: reopenCallSchema, valid: { reason: 'The flame dropped out again' } },
  assignCallSchema: { schema: assignCallSchema, valid: { technicianId: ID } },
  signOffSchema: { schema: signOffSchema, valid: { comment: 'Readings agree with the finding.' } },
  signInSchema: { schema: signInSchema, valid: { email: 'lead@demo.test', password: 'x' }, secret: ['password'] },
  createUserSchema: {
    schema: createUserSchema,
    valid: { email: 'new@example.test', name: 'Ada Quist', role: 'technician', password: 'twelve-chars' },
    secret: ['password'],
  },
  updateUserSchema: { schema: updateUserSchema, valid: { name: 'Bo', role: 'lead', active: true, revokeSessions: true } },
  companySettingsSchema: {
    schema: companySettingsSchema,
    valid: { name: 'Acme', officeEmail: 'office@acme.test', displayUnits: 'us', timeZone: 'America/Toronto' },
  },
};

describe.each(Object.entries(CASES))('%s', (_, { schema, valid, secret = [] }) => {
  it('accepts its valid example', () => {
    expect(schema.safeParse(valid).success).toBe(true);
  });

  it('answers any JSON value without throwing, in words', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (input) => checkAnswer(schema, input, secret)),
      { numRuns: RUNS },
    );
  });

  it('answers its own fields with hostile values without throwing, in words, and stores no NUL', () => {
    fc.assert(
      fc.property(inputs(valid), (input) => checkAnswer(schema, input, secret)),
      { numRuns: RUNS },
    );
  });
});

describe('uuidSchema', () => {
  it('answers anything without throwing, in words', () => {
    fc.assert(
      fc.property(hostile, (input) => checkAnswer(uuidSchema, input, [])),
      { numRuns: RUNS },
    );
  });
});

describe('numbers are numbers', () => {
  const unit = CASES.unitSchema.valid;
  const rating = (transformerVa: unknown) => unitSchema.safeParse({ ...unit, transformerVa });

  it('a string is read as a rating exactly when it is plain digits, and then as those digits', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ unit: 'binary-ascii', maxLength: 8 }), fc.stringMatching(/^\s?[0-9]{1,4}\s?$/)), (text) => {
        const result = rating(text);
        const digits = /^\s*(\d+)\s*$/.exec(text);
        const n = digits ? Number(digits[1]) : NaN;
        expect(result.success).toBe(Boolean(digits) && n >= 10 && n <= 500);
        if (result.success) expect(result.data.transformerVa).toBe(n);
      }),
      { numRuns: 500 },
    );
  });

  it('a JSON number is accepted exactly when it is a whole number in range, digits or not', () => {
    fc.assert(
      fc.property(fc.oneof(fc.integer({ min: -1000, max: 1000 }), fc.double({ noNaN: true, noDefaultInfinity: true })), (n) => {
        const expected = Number.isInteger(n) && n >= 10 && n <= 500;
        expect(rating(n).success).toBe(expected);
        if (Number.isInteger(n) && n >= 0) expect(rating(String(n)).success).toBe(expected);
      }),
      { numRuns: 500 },
    );
  });
});
