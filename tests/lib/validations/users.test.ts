import { z } from 'zod';
import {
  companySettingsSchema,
  createUserSchema,
  TIME_ZONE_NAMES,
  timeZoneSchema,
  updateUserSchema,
  uuidSchema,
} from '@/lib/validations/users';

function refusal(schema: z.ZodType, input: unknown) {
  const result = schema.safeParse(input);
  if (result.success) throw new Error(`expected a refusal for ${JSON.stringify(input)}`);
  return z.flattenError(result.error) as { formErrors: string[]; fieldErrors: Record<string, string[] | undefined> };
}

const good = { email: 'New.Person@Example.TEST', name: '  Ada Quist ', role: 'technician', password: 'twelve-chars' };

describe('createUserSchema', () => {
  it('accepts a complete user, normalising e-mail and name', () => {
    expect(createUserSchema.parse(good)).toEqual({
      email: 'new.person@example.test',
      name: 'Ada Quist',
      role: 'technician',
      password: 'twelve-chars',
    });
  });

  it('refuses an unknown role and names the allowed ones', () => {
    expect(refusal(createUserSchema, { ...good, role: 'owner' }).fieldErrors.role).toEqual([
      'Role must be one of: apprentice, technician, lead, trainer, admin.',
    ]);
  });

  it('refuses a short password (11 characters) and accepts 12', () => {
    expect(refusal(createUserSchema, { ...good, password: 'x'.repeat(11) }).fieldErrors.password).toEqual(['Use at least 12 characters.']);
    expect(createUserSchema.safeParse({ ...good, password: 'x'.repeat(12) }).success).toBe(true);
  });

  it('refuses a blank name, a long name and a bad e-mail, each with its message', () => {
    expect(refusal(createUserSchema, { ...good, name: '   ' }).fieldErrors.name).toEqual(['Enter a name.']);
    expect(refusal(createUserSchema, { ...good, name: 'n'.repeat(121) }).fieldErrors.name).toEqual(['The name is at most 120 characters.']);
    expect(refusal(createUserSchema, { ...good, email: 'not-an-address' }).fieldErrors.email).toEqual(['Enter a valid e-mail address.']);
  });

  it('refuses a password over 200 characters, saying "at most 200 characters", and accepts 200', () => {
    expect(refusal(createUserSchema, { ...good, password: 'x'.repeat(201) }).fieldErrors.password).toEqual([
      'The password is at most 200 characters.',
    ]);
    expect(createUserSchema.safeParse({ ...good, password: 'x'.repeat(200) }).success).toBe(true);
  });

  it('refuses NUL and other control characters in the name and the e-mail, with the field named', () => {
    for (const c of ['\u0000', '\u0008', '\u001b', '\u0085']) {
      const { fieldErrors } = refusal(createUserSchema, { ...good, name: `Ada${c}Quist`, email: `ada${c}@example.test` });
      expect(fieldErrors.name).toEqual(['The name cannot contain control characters.']);
      expect(fieldErrors.email).toEqual(['The e-mail address cannot contain control characters.']);
    }
  });

  // RFC 5321 §4.5.3.1.3: a forward path is at most 256 octets with its angle brackets, so 254 for the address.
  it('limits the e-mail address to 254 characters, checked before the format', () => {
    const at = (n: number) => `${'a'.repeat(n - '@example.test'.length)}@example.test`;
    expect(createUserSchema.parse({ ...good, email: at(254) }).email).toHaveLength(254);
    expect(refusal(createUserSchema, { ...good, email: at(255) }).fieldErrors.email).toEqual([
      'The e-mail address is at most 254 characters.',
    ]);
    const huge = `${'a'.repeat(3000)}@example.test`;
    expect(() => createUserSchema.safeParse({ ...good, email: huge })).not.toThrow();
    expect(refusal(createUserSchema, { ...good, email: huge }).fieldErrors.email).toEqual([
      'The e-mail address is at most 254 characters.',
    ]);
  });

  it('reports every missing field at once', () => {
    const { fieldErrors } = refusal(createUserSchema, {});
    expect(Object.keys(fieldErrors).sort()).toEqual(['email', 'name', 'password', 'role']);
    expect(fieldErrors.password).toEqual(['Enter a starting password.']);
  });
});

describe('updateUserSchema', () => {
  it('accepts each single change', () => {
    expect(updateUserSchema.parse({ role: 'lead' })).toEqual({ role: 'lead' });
    expect(updateUserSchema.parse({ active: false })).toEqual({ active: false });
    expect(updateUserSchema.parse({ revokeSessions: true })).toEqual({ revokeSessions: true });
    expect(updateUserSchema.parse({ name: ' Bo ' })).toEqual({ name: 'Bo' });
  });

  it('refuses an empty change with a form message', () => {
    expect(refusal(updateUserSchema, {}).formErrors).toEqual(['Nothing to change: send name, role, active or revokeSessions.']);
  });

  it('refuses fields it does not know, so an e-mail or company cannot be changed through it', () => {
    const flat = refusal(updateUserSchema, { role: 'lead', companyId: '00000000-0000-4000-8000-000000000000' });
    expect(flat.formErrors.join(' ')).toMatch(/companyId/);
    expect(updateUserSchema.safeParse({ email: 'x@y.test' }).success).toBe(false);
  });

  it('answers an unknown field alone with that one message, not also "Nothing to change"', () => {
    expect(refusal(updateUserSchema, { email: 'x@y.test' }).formErrors).toEqual(['Unknown field in the change: "email".']);
  });

  it('refuses NUL in a new name, and a long one, with the field named', () => {
    expect(refusal(updateUserSchema, { name: 'Bo\u0000' }).fieldErrors.name).toEqual(['The name cannot contain control characters.']);
    expect(refusal(updateUserSchema, { name: 'n'.repeat(121) }).fieldErrors.name).toEqual(['The name is at most 120 characters.']);
  });

  it('refuses a bad role, a non-boolean active and revokeSessions: false', () => {
    expect(refusal(updateUserSchema, { role: 'boss' }).fieldErrors.role).toEqual([
      'Role must be one of: apprentice, technician, lead, trainer, admin.',
    ]);
    expect(refusal(updateUserSchema, { active: 'no' }).fieldErrors.active).toEqual(['active is true or false.']);
    expect(refusal(updateUserSchema, { revokeSessions: false }).fieldErrors.revokeSessions).toEqual(['revokeSessions can only be true.']);
  });
});

describe('companySettingsSchema', () => {
  it('accepts settings and normalises the office e-mail', () => {
    expect(companySettingsSchema.parse({ name: ' Acme ', officeEmail: 'Office@Acme.TEST', displayUnits: 'metric' })).toEqual({
      name: 'Acme',
      officeEmail: 'office@acme.test',
      displayUnits: 'metric',
    });
  });

  it('refuses a bad e-mail, blank name and unknown units with messages', () => {
    const { fieldErrors } = refusal(companySettingsSchema, { name: '', officeEmail: 'nope', displayUnits: 'imperial' });
    expect(fieldErrors.name).toEqual(['Enter the company name.']);
    expect(fieldErrors.officeEmail).toEqual(['Enter a valid e-mail address.']);
    expect(fieldErrors.displayUnits).toEqual(['Choose US customary or metric.']);
  });

  it('refuses NUL in the company name, a long name and a long office e-mail, in words', () => {
    const ok = { name: 'Acme', officeEmail: 'office@acme.test', displayUnits: 'us' };
    expect(refusal(companySettingsSchema, { ...ok, name: 'Ac\u0000me' }).fieldErrors.name).toEqual([
      'The company name cannot contain control characters.',
    ]);
    expect(refusal(companySettingsSchema, { ...ok, name: 'a'.repeat(121) }).fieldErrors.name).toEqual([
      'The company name is at most 120 characters.',
    ]);
    expect(refusal(companySettingsSchema, { ...ok, officeEmail: `${'o'.repeat(250)}@acme.test` }).fieldErrors.officeEmail).toEqual([
      'The office e-mail address is at most 254 characters.',
    ]);
  });
});

describe('the company time zone', () => {
  const ok = { name: 'Acme', officeEmail: 'office@acme.test', displayUnits: 'us' };

  it('takes an IANA zone the runtime knows, or UTC, and may be left out by older clients', () => {
    expect(companySettingsSchema.parse({ ...ok, timeZone: 'America/Toronto' }).timeZone).toBe('America/Toronto');
    expect(companySettingsSchema.parse({ ...ok, timeZone: 'America/Vancouver' }).timeZone).toBe('America/Vancouver');
    expect(companySettingsSchema.parse({ ...ok, timeZone: 'UTC' }).timeZone).toBe('UTC');
    expect(companySettingsSchema.parse(ok).timeZone).toBeUndefined();
    expect(timeZoneSchema.safeParse('America/Toronto').success).toBe(true);
  });

  it('refuses anything else in words', () => {
    for (const timeZone of ['Mars/Olympus_Mons', 'america/toronto', '', 'x'.repeat(65)]) {
      const [message] = refusal(companySettingsSchema, { ...ok, timeZone }).fieldErrors.timeZone ?? [];
      expect(message, timeZone).toMatch(/^(Choose a time zone from the list|A time zone name is at most 64 characters)/);
    }
    expect(refusal(companySettingsSchema, { ...ok, timeZone: 5 }).fieldErrors.timeZone).toEqual(['Choose a time zone from the list.']);
  });

  it('offers exactly the zones it accepts', () => {
    expect(TIME_ZONE_NAMES).toContain('America/Toronto');
    expect(TIME_ZONE_NAMES.every((zone) => timeZoneSchema.safeParse(zone).success)).toBe(true);
  });
});

describe('uuidSchema', () => {
  it('accepts a UUID and refuses anything else', () => {
    expect(uuidSchema.safeParse('3f1c2a9e-7b4d-4c1e-9a2b-0d5e6f7a8b9c').success).toBe(true);
    expect(refusal(uuidSchema, '42').formErrors).toEqual(['Not a valid id.']);
  });
});
