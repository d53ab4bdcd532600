import { z } from 'zod';

export const signInSchema = z.object({
  email: z
    .string({ error: 'Enter your e-mail address.' })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;
