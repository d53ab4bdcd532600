import { z } from 'zod';
import { ROLES } from '@/lib/roles';
import { emailAddress, objectError, secret, singleLine } from '@/lib/validations/text';

const name = singleLine({ label: 'The name', max: 120, required: 'Enter a name.' });
const role = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` });

const PASSWORD_MIN = 12;
const PASSWORD_MAX = 200;

export const createUserSchema = z.object(
  {
    email: emailAddress({ label: 'The e-mail address', required: 'Enter an e-mail address.' }),
    name,
    role,
    password: secret({
      label: 'The password',
      min: PASSWORD_MIN,
      max: PASSWORD_MAX,
      missing: 'Enter a starting password.',
      tooShort: `Use at least ${PASSWORD_MIN} characters.`,
    }),
  },
  { error: objectError('the new user') },
);
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .strictObject(
    {
      name: name.optional(),
      role: role.optional(),
      active: z.boolean({ error: 'active is true or false.' }).optional(),
      revokeSessions: z.literal(true, { error: 'revokeSessions can only be true.' }).optional(),
    },
    { error: objectError('the change') },
  )
  // Only for an otherwise clean change: unknown fields alone already say what is wrong.
  .refine((v) => Object.keys(v).length > 0, {
    error: 'Nothing to change: send name, role, active or revokeSessions.',
    when: (payload) => payload.issues.length === 0,
  });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

// The runtime's own list of IANA zones (canonical names), plus UTC, which it accepts but does not list.
const TIME_ZONES: ReadonlySet<string> = new Set([...Intl.supportedValuesOf('timeZone'), 'UTC']);
export const timeZoneSchema = z
  .string({ error: 'Choose a time zone from the list.' })
  .refine((v) => v.length <= 64, { error: 'A time zone name is at most 64 characters.', abort: true })
  .refine((v) => TIME_ZONES.has(v), { error: 'Choose a time zone from the list, e.g. America/Toronto.' });

/** Every zone the setting accepts, for the picker. */
export const TIME_ZONE_NAMES: readonly string[] = [...TIME_ZONES].sort();

export const companySettingsSchema = z.object(
  {
    name: singleLine({ label: 'The company name', max: 120, required: 'Enter the company name.' }),
    officeEmail: emailAddress({ label: 'The office e-mail address', required: 'Enter the office e-mail address.' }),
    displayUnits: z.enum(['us', 'metric'], { error: 'Choose US customary or metric.' }),
    // Optional so that clients from before the setting keep working; left out, the zone stays as it is.
    timeZone: timeZoneSchema.optional(),
  },
  { error: objectError('the company settings') },
);
export type CompanySettingsInput = z.infer<typeof companySettingsSchema>;

export const uuidSchema = z.uuid({ error: 'Not a valid id.' });
