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
    expect(fieldErrors({ email: 42, password: 'x' }).email).toEqual(['Enter your e-mail address.']);
    expect(fieldErrors({ email: 'a@b.test', password: 7 }).password).toEqual(['Enter your password.']);
  });

  it('refuses something that is not an e-mail address', () => {
    expect(fieldErrors({ email: 'lead-at-demo.test', password: 'x' }).email).toEqual(['Enter a valid e-mail address.']);
  });

  it('refuses an absurdly long password', () => {
    expect(fieldErrors({ email: 'a@b.test', password: 'x'.repeat(201) }).password?.length).toBe(1);
    expect(signInSchema.safeParse({ email: 'a@b.test', password: 'x'.repeat(200) }).success).toBe(true);
  });
});
