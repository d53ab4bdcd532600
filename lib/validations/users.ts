import { z } from 'zod';
import { ROLES } from '@/lib/roles';

const name = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, { error: 'Enter a name.' })
  .max(120, { error: 'Keep the name under 120 characters.' });
const role = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` });

export const createUserSchema = z.object({
  email: z
    .string({ error: 'Enter an e-mail address.' })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  name,
  role,
  password: z
    .string({ error: 'Enter a starting password.' })
    .min(12, { error: 'Use at least 12 characters.' })
    .max(200, { error: 'Keep the password under 200 characters.' }),
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    name: name.optional(),
    role: role.optional(),
    active: z.boolean({ error: 'active is true or false.' }).optional(),
    revokeSessions: z.literal(true, { error: 'revokeSessions can only be true.' }).optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change: send name, role, active or revokeSessions.' });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const companySettingsSchema = z.object({
  name: z.string().trim().min(1, { error: 'Enter the company name.' }).max(120),
  officeEmail: z
    .string()
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  displayUnits: z.enum(['us', 'metric'], { error: 'Choose US customary or metric.' }),
});
export type CompanySettingsInput = z.infer<typeof companySettingsSchema>;

export const uuidSchema = z.uuid({ error: 'Not a valid id.' });
