import { z } from 'zod';
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

function fieldErrors(schema: z.ZodType, input: unknown) {
  const result = schema.safeParse(input);
  if (result.success) throw new Error(`expected a refusal for ${JSON.stringify(input)}`);
  return z.flattenError(result.error) as { formErrors: string[]; fieldErrors: Record<string, string[] | undefined> };
}

const ID = '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a01';
const NUL = '\u0000';

describe('siteSchema', () => {
  const site = { name: 'Oduya residence', address: '41 Larchmont Rise', contactEmail: 'Owner@Example.TEST' };

  it('accepts a site, trimming the texts and lower-casing the e-mail', () => {
    expect(siteSchema.parse({ ...site, name: ' Oduya residence ' })).toEqual({ ...site, contactEmail: 'owner@example.test' });
  });

  it('reads a missing, empty or null customer e-mail as none, and accepts its own output again', () => {
    const { contactEmail: _, ...withoutEmail } = site;
    expect(siteSchema.parse(withoutEmail).contactEmail).toBeNull();
    expect(siteSchema.parse({ ...site, contactEmail: '' }).contactEmail).toBeNull();
    expect(siteSchema.parse({ ...site, contactEmail: null }).contactEmail).toBeNull();
    // What the new-site form hands to the server: the resolver's output, contactEmail null.
    const fromForm = siteSchema.parse({ name: 'A', address: 'B', contactEmail: '' });
    expect(siteSchema.parse(fromForm)).toEqual(fromForm);
  });

  it('refuses NUL and other control characters in the name and address with the field named', () => {
    const { fieldErrors: e } = fieldErrors(siteSchema, { ...site, name: `Oduya${NUL}`, address: '41\u001bLarchmont' });
    expect(e.name).toEqual(['The site name cannot contain control characters.']);
    expect(e.address).toEqual(['The address cannot contain control characters.']);
  });

  it('says "at most 160 characters" for a 161-character name, not "Enter the site name."', () => {
    expect(siteSchema.safeParse({ ...site, name: 'n'.repeat(160) }).success).toBe(true);
    expect(fieldErrors(siteSchema, { ...site, name: 'n'.repeat(161) }).fieldErrors.name).toEqual([
      'The site name is at most 160 characters.',
    ]);
    expect(fieldErrors(siteSchema, { ...site, address: 'a'.repeat(301) }).fieldErrors.address).toEqual([
      'The address is at most 300 characters.',
    ]);
  });

  it('limits the customer e-mail to 254 characters and refuses a 1 MB one', () => {
    const at = (n: number) => `${'a'.repeat(n - '@example.test'.length)}@example.test`;
    expect(siteSchema.parse({ ...site, contactEmail: at(254) }).contactEmail).toHaveLength(254);
    expect(fieldErrors(siteSchema, { ...site, contactEmail: at(255) }).fieldErrors.contactEmail).toEqual([
      'The customer e-mail address is at most 254 characters.',
    ]);
    expect(fieldErrors(siteSchema, { ...site, contactEmail: at(1024 * 1024) }).fieldErrors.contactEmail).toEqual([
      'The customer e-mail address is at most 254 characters.',
    ]);
  });

  it('gives words, never "Invalid input", for a bad customer e-mail of any type', () => {
    for (const bad of ['nope', 5, true, [], {}, `a${NUL}@example.test`]) {
      const [message] = fieldErrors(siteSchema, { ...site, contactEmail: bad }).fieldErrors.contactEmail ?? [];
      expect(message).toMatch(/^(Enter a valid e-mail address\.|The customer e-mail address .+\.)$/);
    }
  });

  it('refuses empty fields with the form’s messages', () => {
    const { fieldErrors: e } = fieldErrors(siteSchema, { name: '', address: '  ' });
    expect(e.name).toEqual(['Enter the site name.']);
    expect(e.address).toEqual(['Enter the address.']);
  });
});

describe('unitSchema', () => {
  const unit = { siteId: ID, label: 'Basement furnace', ignition: 'two-rod', fuel: 'natural-gas', controlSupply: '24v', transformerVa: 40 };

  it('accepts a unit with the rating as a number or as digits, and no install year', () => {
    // The draft is optional for clients written before it; induced draft is the default.
    expect(unitSchema.parse(unit)).toEqual({ ...unit, draft: 'induced', installYear: null });
    expect(unitSchema.parse({ ...unit, draft: 'natural' })).toMatchObject({ draft: 'natural' });
    expect(fieldErrors(unitSchema, { ...unit, draft: 'forced' }).fieldErrors.draft).toEqual(['Draft is induced or natural.']);
    expect(unitSchema.parse({ ...unit, transformerVa: '40', installYear: '2011' })).toMatchObject({ transformerVa: 40, installYear: 2011 });
  });

  // 40 VA is the common residential furnace control transformer (common practice, no source).
  it('refuses "0x28", "4e1" and "Infinity" for the rating instead of reading 40 or more', () => {
    for (const bad of ['0x28', '4e1', 'Infinity']) {
      expect(fieldErrors(unitSchema, { ...unit, transformerVa: bad }).fieldErrors.transformerVa).toEqual([
        'Enter the transformer rating in VA as a number, e.g. 40.',
      ]);
    }
  });

  it('refuses null, true, false, [] and {} for the rating instead of coercing them', () => {
    for (const bad of [true, false, [], {}]) {
      expect(fieldErrors(unitSchema, { ...unit, transformerVa: bad }).fieldErrors.transformerVa).toEqual([
        'Enter the transformer rating in VA as a number, e.g. 40.',
      ]);
    }
    for (const none of [null, '', undefined]) {
      expect(fieldErrors(unitSchema, { ...unit, transformerVa: none }).fieldErrors.transformerVa).toEqual([
        'Enter the transformer rating in VA.',
      ]);
    }
  });

  it('keeps the rating’s range and whole-number messages', () => {
    expect(fieldErrors(unitSchema, { ...unit, transformerVa: '5' }).fieldErrors.transformerVa).toEqual([
      'A control transformer is at least 10 VA.',
    ]);
    expect(fieldErrors(unitSchema, { ...unit, transformerVa: 501 }).fieldErrors.transformerVa).toEqual([
      'Control transformers above 500 VA are not furnace controls.',
    ]);
    expect(fieldErrors(unitSchema, { ...unit, transformerVa: '40.5' }).fieldErrors.transformerVa).toEqual(['Enter a whole number of VA.']);
  });

  it('reads an empty, null or missing install year as none, and refuses one that is not a year', () => {
    for (const none of ['', null, undefined]) expect(unitSchema.parse({ ...unit, installYear: none }).installYear).toBeNull();
    for (const bad of ['0x7db', '2.011e3', true, [], {}]) {
      expect(fieldErrors(unitSchema, { ...unit, installYear: bad }).fieldErrors.installYear).toEqual([
        'Enter a year in digits, e.g. 2011, or leave it empty.',
      ]);
    }
    expect(fieldErrors(unitSchema, { ...unit, installYear: 1949 }).fieldErrors.installYear).toEqual(['Enter a year from 1950 on.']);
    expect(fieldErrors(unitSchema, { ...unit, installYear: new Date().getFullYear() + 1 }).fieldErrors.installYear).toEqual([
      'The install year cannot be in the future.',
    ]);
  });

  it('refuses control characters and a long label with the field named', () => {
    expect(fieldErrors(unitSchema, { ...unit, label: `Attic${NUL}` }).fieldErrors.label).toEqual([
      'The unit label cannot contain control characters.',
    ]);
    expect(fieldErrors(unitSchema, { ...unit, label: 'l'.repeat(161) }).fieldErrors.label).toEqual([
      'The unit label is at most 160 characters.',
    ]);
    expect(fieldErrors(unitSchema, { ...unit, label: '' }).fieldErrors.label).toEqual(['Name the unit (e.g. "Basement furnace").']);
  });

  it('names the choices when an enum is wrong or missing', () => {
    const { fieldErrors: e } = fieldErrors(unitSchema, { ...unit, ignition: 'hot-surface', fuel: null, controlSupply: 24, siteId: 'x' });
    expect(e.ignition).toEqual(['Ignition is two-rod or single-rod.']);
    expect(e.fuel).toEqual(['Fuel is natural-gas or lp.']);
    expect(e.controlSupply).toEqual(['Control supply is 24v or line.']);
    expect(e.siteId).toEqual(['Choose a site.']);
  });
});

describe('callSchema', () => {
  const call = { unitId: ID, complaint: 'No heat' };

  it('keeps line breaks in the complaint and reads the "Not assigned yet" option as no technician', () => {
    expect(callSchema.parse({ ...call, complaint: 'No heat.\nClicks, then\tstops.', technicianId: '' })).toEqual({
      unitId: ID,
      complaint: 'No heat.\nClicks, then\tstops.',
      technicianId: null,
    });
    expect(callSchema.parse({ ...call, technicianId: ID }).technicianId).toBe(ID);
    expect(callSchema.parse(call).technicianId).toBeUndefined();
  });

  it('refuses NUL in the complaint and words its length limit', () => {
    expect(fieldErrors(callSchema, { ...call, complaint: `No${NUL}heat` }).fieldErrors.complaint).toEqual([
      'The complaint cannot contain control characters.',
    ]);
    expect(fieldErrors(callSchema, { ...call, complaint: 'c'.repeat(1001) }).fieldErrors.complaint).toEqual([
      'The complaint is at most 1000 characters.',
    ]);
    expect(fieldErrors(callSchema, { ...call, complaint: '' }).fieldErrors.complaint).toEqual(['Describe the complaint.']);
  });

  it('refuses a technician that is not an id', () => {
    for (const bad of ['someone', 7, true, []]) {
      expect(fieldErrors(callSchema, { ...call, technicianId: bad }).fieldErrors.technicianId).toEqual(['Choose a technician.']);
    }
  });
});

describe('callFilterSchema', () => {
  it('accepts a status and a technician id or "me", and names the choices otherwise', () => {
    expect(callFilterSchema.parse({ status: 'open', technician: 'me' })).toEqual({ status: 'open', technician: 'me' });
    const { fieldErrors: e } = fieldErrors(callFilterSchema, { status: 'lost', technician: 'you' });
    expect(e.status).toEqual(['status is one of: open, diagnosing, repaired, closed, referred.']);
    expect(e.technician).toEqual(['technician must be a user id or "me".']);
  });
});

describe('startDiagnosisSchema and closeCallSchema', () => {
  it('need a tree version id, and close or refer (close by default)', () => {
    expect(fieldErrors(startDiagnosisSchema, { treeVersionId: 'v1' }).fieldErrors.treeVersionId).toEqual([
      'Choose a published tree version.',
    ]);
    expect(closeCallSchema.parse({})).toEqual({ outcome: 'closed' });
    expect(fieldErrors(closeCallSchema, { outcome: 'lost' }).fieldErrors.outcome).toEqual(['Close the call, or refer it.']);
  });
});

describe('referring, reopening, reassigning and signing off', () => {
  it('a referral says why; a close needs no reason', () => {
    expect(closeCallSchema.parse({ outcome: 'referred', reason: ' Part on order ' })).toEqual({
      outcome: 'referred',
      reason: 'Part on order',
    });
    for (const reason of [undefined, '', '   ']) {
      expect(fieldErrors(closeCallSchema, { outcome: 'referred', reason }).fieldErrors.reason).toEqual([
        'Say why you refer the call, e.g. "needs a new heat exchanger, office to quote".',
      ]);
    }
    expect(closeCallSchema.parse({ outcome: 'closed' })).toEqual({ outcome: 'closed' });
    expect(fieldErrors(closeCallSchema, { outcome: 'referred', reason: 'x'.repeat(1001) }).fieldErrors.reason).toEqual([
      'The reason is at most 1000 characters.',
    ]);
  });

  it('a reopening says why, an assignment names someone, a sign-off comment is optional', () => {
    expect(fieldErrors(reopenCallSchema, {}).fieldErrors.reason).toEqual(['Say why the call is reopened.']);
    expect(fieldErrors(reopenCallSchema, { reason: ' ' }).fieldErrors.reason).toEqual(['Say why the call is reopened.']);
    expect(reopenCallSchema.parse({ reason: 'Part arrived' })).toEqual({ reason: 'Part arrived' });
    expect(fieldErrors(assignCallSchema, { technicianId: '' }).fieldErrors.technicianId).toEqual(['Choose a technician from the list.']);
    expect(assignCallSchema.parse({ technicianId: ID })).toEqual({ technicianId: ID });
    expect(signOffSchema.parse({})).toEqual({});
    expect(fieldErrors(signOffSchema, { comment: `ok${NUL}` }).fieldErrors.comment).toEqual([
      'The comment cannot contain control characters.',
    ]);
  });
});

describe('answerSchema', () => {
  const answer = { clientId: ID, stepId: 'flame-signal', text: '4.2', unit: 'µA' };

  it('accepts an answer', () => {
    expect(answerSchema.parse({ ...answer, choice: 'yes', confirmed: true })).toEqual({ ...answer, choice: 'yes', confirmed: true });
  });

  it('bounds and cleans every text: stepId 200, reading 100, unit 20, choice 100', () => {
    const e = (over: object) => fieldErrors(answerSchema, { ...answer, ...over }).fieldErrors;
    expect(e({ stepId: 's'.repeat(201) }).stepId).toEqual(['stepId is at most 200 characters.']);
    expect(e({ stepId: `flame${NUL}` }).stepId).toEqual(['stepId cannot contain control characters.']);
    expect(e({ stepId: '' }).stepId).toEqual(['stepId is required.']);
    expect(e({ text: '4'.repeat(101) }).text).toEqual(['The reading is at most 100 characters.']);
    expect(e({ text: `4.2${NUL}` }).text).toEqual(['The reading cannot contain control characters.']);
    expect(e({ unit: 'u'.repeat(21) }).unit).toEqual(['The unit of the reading is at most 20 characters.']);
    expect(e({ choice: 'c'.repeat(101) }).choice).toEqual(['The choice is at most 100 characters.']);
    expect(e({ confirmed: 'yes' }).confirmed).toEqual(['confirmed is true or false.']);
  });

  it('stays strict: an unknown field is refused by name', () => {
    expect(fieldErrors(answerSchema, { ...answer, value: 4.2 }).formErrors).toEqual(['Unknown field in the answer: "value".']);
  });
});

describe('repairSchema', () => {
  const repair = { repairNotes: 'Cleaned the flame rod.', cycles: 3 };

  it('accepts cycles as a number or digits and defaults the checks', () => {
    expect(repairSchema.parse(repair)).toEqual({ ...repair, checks: [] });
    expect(repairSchema.parse({ ...repair, cycles: '3' }).cycles).toBe(3);
    expect(repairSchema.parse({ ...repair, cycles: 0 }).cycles).toBe(0);
  });

  it('refuses null, true, [], {} and hex for cycles instead of coercing them', () => {
    for (const bad of [true, false, [], {}, '0x3', '3e0']) {
      expect(fieldErrors(repairSchema, { ...repair, cycles: bad }).fieldErrors.cycles).toEqual([
        'Enter the heat cycles as a number, e.g. 3.',
      ]);
    }
    for (const none of [null, '', undefined]) {
      expect(fieldErrors(repairSchema, { ...repair, cycles: none }).fieldErrors.cycles).toEqual(['Enter how many heat cycles you ran.']);
    }
    expect(fieldErrors(repairSchema, { ...repair, cycles: 51 }).fieldErrors.cycles).toEqual(['At most 50 cycles.']);
    expect(fieldErrors(repairSchema, { ...repair, cycles: -1 }).fieldErrors.cycles).toEqual(['The number of cycles cannot be negative.']);
  });

  it('refuses NUL in the notes and the checks, and keeps line breaks in the notes', () => {
    expect(repairSchema.parse({ ...repair, repairNotes: 'Line one\nLine two' }).repairNotes).toBe('Line one\nLine two');
    const { fieldErrors: e } = fieldErrors(repairSchema, {
      ...repair,
      repairNotes: `Cleaned${NUL}`,
      notes: `Call${NUL}back`,
      flameSignal: `4.2${NUL}`,
      checks: [{ text: `Rod${NUL}`, done: true }],
    });
    expect(e.repairNotes).toEqual(['The repair notes cannot contain control characters.']);
    expect(e.notes).toEqual(['The notes cannot contain control characters.']);
    expect(e.flameSignal).toEqual(['The flame signal cannot contain control characters.']);
    expect(e.checks).toEqual(['A check cannot contain control characters.']);
  });

  it('bounds the checklist: at most 30 checks of at most 300 characters each', () => {
    const checks = (n: number, text = 'Flame holds') => Array.from({ length: n }, () => ({ text, done: true }));
    expect(repairSchema.parse({ ...repair, checks: checks(30) }).checks).toHaveLength(30);
    expect(fieldErrors(repairSchema, { ...repair, checks: checks(31) }).fieldErrors.checks).toEqual([
      'The checklist is at most 30 checks.',
    ]);
    expect(fieldErrors(repairSchema, { ...repair, checks: checks(1, 'c'.repeat(301)) }).fieldErrors.checks).toEqual([
      'A check is at most 300 characters.',
    ]);
    expect(fieldErrors(repairSchema, { ...repair, checks: 'all done' }).fieldErrors.checks).toEqual([
      'The checks are a list of { text, done }.',
    ]);
    expect(fieldErrors(repairSchema, { ...repair, checks: [{ text: 'x', done: 'yes' }] }).fieldErrors.checks).toEqual([
      'Each check is done (true) or not (false).',
    ]);
  });

  it('words the other length limits', () => {
    const { fieldErrors: e } = fieldErrors(repairSchema, {
      ...repair,
      repairNotes: 'r'.repeat(4001),
      notes: 'n'.repeat(2001),
      flameSignal: 'f'.repeat(41),
    });
    expect(e.repairNotes).toEqual(['The repair notes is at most 4000 characters.']);
    expect(e.notes).toEqual(['The notes is at most 2000 characters.']);
    expect(e.flameSignal).toEqual(['The flame signal is at most 40 characters.']);
  });

  it('can still be extended with the call id, as the operation does', () => {
    const withCall = repairSchema.extend({ callId: z.string() });
    expect(withCall.parse({ ...repair, callId: 'c1' })).toEqual({ ...repair, checks: [], callId: 'c1' });
  });
});

describe('every refusal is in words', () => {
  const bad: [string, z.ZodType, unknown][] = [
    ['site', siteSchema, { name: 1, address: [], contactEmail: {} }],
    ['unit', unitSchema, { siteId: null, label: {}, ignition: 1, fuel: [], controlSupply: true, transformerVa: 'x', installYear: 'y' }],
    ['call', callSchema, { unitId: 1, complaint: null, technicianId: {} }],
    ['filter', callFilterSchema, { status: 1, technician: [] }],
    ['start', startDiagnosisSchema, { treeVersionId: {} }],
    ['answer', answerSchema, { clientId: 1, stepId: null, text: 1, unit: [], choice: {}, confirmed: 'x', extra: 1 }],
    ['repair', repairSchema, { repairNotes: 1, cycles: {}, flameSignal: 2, checks: [1, { text: 1, done: 1 }], notes: [] }],
    ['close', closeCallSchema, { outcome: 1 }],
    ['refer', closeCallSchema, { outcome: 'referred', reason: [] }],
    ['reopen', reopenCallSchema, { reason: 1 }],
    ['assign', assignCallSchema, { technicianId: [] }],
    ['sign-off', signOffSchema, { comment: {} }],
    ['site, as text', siteSchema, { name: 'n'.repeat(161), address: '\u0007', contactEmail: 'x'.repeat(300) }],
    [
      'unit, as text',
      unitSchema,
      { siteId: 'x', label: '\u0000', ignition: 'x', fuel: 'x', controlSupply: 'x', transformerVa: '0x28', installYear: '4e1' },
    ],
    ['call, as text', callSchema, { unitId: 'x', complaint: '\u0000', technicianId: 'x' }],
    ['filter, as text', callFilterSchema, { status: 'x', technician: 'x' }],
    ['answer, as text', answerSchema, { clientId: 'x', stepId: '\u0000', text: '\uD800', unit: 'x'.repeat(21), choice: 'x'.repeat(101) }],
    [
      'repair, as text',
      repairSchema,
      { repairNotes: '\u0000', cycles: 'Infinity', flameSignal: '\u0085', checks: 'x'.repeat(40), notes: '\uDC00' },
    ],
    ['not an object', siteSchema, 'site'],
    ['an array', unitSchema, []],
  ];
  it.each(bad)('%s', (_, schema, input) => {
    const result = schema.safeParse(input);
    expect(result.success).toBe(false);
    for (const issue of result.error!.issues)
      expect(issue.message).not.toMatch(/Invalid input|^Invalid |^Too (big|small)|^Unrecognized key/);
  });
});
