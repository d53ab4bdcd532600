import { z } from 'zod';
import { emailAddress, objectError, secret } from '@/lib/validations/text';

export const signInSchema = z.object(
  {
    email: emailAddress({ label: 'The e-mail address', required: 'Enter your e-mail address.' }),
    password: secret({ label: 'The password', min: 1, max: 200, missing: 'Enter your password.', tooShort: 'Enter your password.' }),
  },
  { error: objectError('the sign-in') },
);
export type SignInInput = z.infer<typeof signInSchema>;
