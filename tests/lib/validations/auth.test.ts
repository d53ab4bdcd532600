import { z } from 'zod';
import { signInSchema } from '@/lib/validations/auth';

function fieldErrors(input: unknown) {
  const result = signInSchema.safeParse(input);
  if (result.success) throw new Error(`expected a refusal for ${JSON.stringify(input)}`);
  return z.flattenError(result.error).fieldErrors as Record<string, string[] | undefined>;
}

describe('signInSchema', () => {
  it('accepts an e-mail and password, trimming and lower-casing the e-mail', () => {
    expect(signInSchema.parse({ email: '  Lead@Demo.TEST ', password: 'x' })).toEqual({ email: 'lead@demo.test', password: 'x' });
  });

  it('keeps the password exactly as typed', () => {
    expect(signInSchema.parse({ email: 'a@b.test', password: ' Pass word ' }).password).toBe(' Pass word ');
  });

  it('refuses empty fields with messages for each', () => {
    const errors = fieldErrors({ email: '', password: '' });
    expect(errors.email).toEqual(['Enter a valid e-mail address.']);
    expect(errors.password).toEqual(['Enter your password.']);
  });

  it('refuses missing fields and wrong types', () => {
    expect(fieldErrors({}).email).toEqual(['Enter your e-mail address.']);
    expect(fieldErrors({}).password).toEqual(['Enter your password.']);
    expect(fieldErrors({ email: null, password: null }).email).toEqual(['Enter your e-mail address.']);
    expect(fieldErrors({ email: 42, password: 'x' }).email).toEqual(['The e-mail address must be text.']);
    expect(fieldErrors({ email: 'a@b.test', password: 7 }).password).toEqual(['The password must be text.']);
  });

  it('refuses something that is not an e-mail address', () => {
    expect(fieldErrors({ email: 'lead-at-demo.test', password: 'x' }).email).toEqual(['Enter a valid e-mail address.']);
  });

  it('refuses an absurdly long password, saying "at most 200 characters"', () => {
    expect(fieldErrors({ email: 'a@b.test', password: 'x'.repeat(201) }).password).toEqual(['The password is at most 200 characters.']);
    expect(signInSchema.safeParse({ email: 'a@b.test', password: 'x'.repeat(200) }).success).toBe(true);
  });

  // RFC 5321 §4.5.3.1.3: a forward path is at most 256 octets with its angle brackets, so 254 for the address.
  it('accepts a 254-character e-mail address and refuses 255 with its own message', () => {
    const at = (n: number) => `${'a'.repeat(n - '@b.test'.length)}@b.test`;
    expect(signInSchema.parse({ email: at(254), password: 'x' }).email).toHaveLength(254);
    expect(fieldErrors({ email: at(255), password: 'x' }).email).toEqual(['The e-mail address is at most 254 characters.']);
  });

  it('refuses a 3,000-character e-mail address by its length, without throwing', () => {
    const email = `${'a'.repeat(3000)}@b.test`;
    expect(() => signInSchema.safeParse({ email, password: 'x' })).not.toThrow();
    expect(fieldErrors({ email, password: 'x' }).email).toEqual(['The e-mail address is at most 254 characters.']);
  });

  it('refuses NUL and other control characters in the e-mail address with the field named', () => {
    for (const c of ['\u0000', '\u0001', '\u001f', '\u007f', '\u009f']) {
      expect(fieldErrors({ email: `a${c}@b.test`, password: 'x' }).email).toEqual([
        'The e-mail address cannot contain control characters.',
      ]);
    }
  });

  it('refuses what is not an object of fields', () => {
    for (const bad of [null, 'lead@demo.test', [], 3])
      expect(signInSchema.safeParse(bad).error?.issues.map((i) => i.message)).toEqual(['Send the sign-in as an object of fields.']);
  });
});
