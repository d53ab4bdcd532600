import { z } from 'zod';

// Shared by the forms (zodResolver), the server actions and the route handlers.

export const siteSchema = z.object({
  name: z.string({ error: 'Enter the site name.' }).trim().min(1, { error: 'Enter the site name.' }).max(160),
  address: z.string({ error: 'Enter the address.' }).trim().min(1, { error: 'Enter the address.' }).max(300),
  contactEmail: z
    .union([
      z.literal(''),
      z
        .string()
        .trim()
        .toLowerCase()
        .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
    ])
    .optional()
    .transform((v) => (v ? v : null)),
});
export type SiteInput = z.infer<typeof siteSchema>;

const thisYear = new Date().getFullYear();

export const unitSchema = z.object({
  siteId: z.uuid({ error: 'Choose a site.' }),
  label: z.string({ error: 'Name the unit.' }).trim().min(1, { error: 'Name the unit (e.g. "Basement furnace").' }).max(160),
  ignition: z.enum(['two-rod', 'single-rod'], { error: 'Ignition is two-rod or single-rod.' }),
  fuel: z.enum(['natural-gas', 'lp'], { error: 'Fuel is natural-gas or lp.' }),
  controlSupply: z.enum(['24v', 'line'], { error: 'Control supply is 24v or line.' }),
  transformerVa: z.coerce
    .number({ error: 'Enter the transformer rating in VA.' })
    .int({ error: 'Enter a whole number of VA.' })
    .min(10, { error: 'A control transformer is at least 10 VA.' })
    .max(500, { error: 'Control transformers above 500 VA are not furnace controls.' }),
  installYear: z
    .union([
      z.literal(''),
      z.null(),
      z.coerce
        .number()
        .int({ error: 'Enter a year.' })
        .min(1950, { error: 'Enter a year from 1950 on.' })
        .max(thisYear, { error: 'The install year cannot be in the future.' }),
    ])
    .optional()
    .transform((v) => (v === '' || v === undefined ? null : v)),
});
export type UnitInput = z.infer<typeof unitSchema>;

export const CALL_STATUSES = ['open', 'diagnosing', 'repaired', 'closed', 'referred'] as const;
export type CallStatus = (typeof CALL_STATUSES)[number];

export const callSchema = z.object({
  unitId: z.uuid({ error: 'Choose a unit.' }),
  complaint: z.string({ error: 'Describe the complaint.' }).trim().min(1, { error: 'Describe the complaint.' }).max(1000),
  technicianId: z.uuid({ error: 'Choose a technician.' }).optional().nullable(),
});
export type CallInput = z.infer<typeof callSchema>;

export const callFilterSchema = z.object({
  status: z.enum(CALL_STATUSES, { error: `status is one of: ${CALL_STATUSES.join(', ')}.` }).optional(),
  technician: z.union([z.uuid({ error: 'technician must be a user id or "me".' }), z.literal('me')]).optional(),
});

export const startDiagnosisSchema = z.object({
  treeVersionId: z.uuid({ error: 'Choose a published tree version.' }),
});

export const answerSchema = z
  .object({
    clientId: z.uuid({ error: 'clientId must be a UUID made by the client.' }),
    stepId: z.string({ error: 'stepId is required.' }).min(1).max(200),
    text: z.string().max(100, { error: 'A reading is at most 100 characters.' }).optional(),
    unit: z.string().max(20).optional(),
    choice: z.string().max(100).optional(),
    confirmed: z.boolean().optional(),
  })
  .strict();
export type AnswerInput = z.infer<typeof answerSchema>;

export const repairSchema = z.object({
  repairNotes: z.string().trim().min(1, { error: 'Describe the repair.' }).max(4000),
  cycles: z.coerce.number().int().min(0).max(50, { error: 'At most 50 cycles.' }),
  flameSignal: z.string().trim().max(40).optional(),
  checks: z
    .array(z.object({ text: z.string().max(300), done: z.boolean() }))
    .max(30)
    .default([]),
  notes: z.string().trim().max(2000).optional(),
});
export type RepairInput = z.infer<typeof repairSchema>;

export const closeCallSchema = z.object({
  outcome: z.enum(['closed', 'referred'], { error: 'Close the call, or refer it.' }).default('closed'),
});
