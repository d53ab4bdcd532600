import { z } from 'zod';
import { multiLine, objectError, optionalEmailAddress, optionalWholeNumber, singleLine, wholeNumber } from '@/lib/validations/text';

// Shared by the forms (zodResolver), the server actions and the route handlers. A form sends what its
// resolver gave back, so each schema also accepts its own output (e.g. a site's contactEmail: null).
// A union reports the issues of the one option whose type matched, so each option carries the message too.

export const siteSchema = z.object(
  {
    name: singleLine({ label: 'The site name', max: 160, required: 'Enter the site name.' }),
    address: singleLine({ label: 'The address', max: 300, required: 'Enter the address.' }),
    contactEmail: optionalEmailAddress({ label: 'The customer e-mail address' }),
  },
  { error: objectError('the site') },
);
export type SiteInput = z.infer<typeof siteSchema>;

const thisYear = new Date().getFullYear();

export const unitSchema = z.object(
  {
    siteId: z.uuid({ error: 'Choose a site.' }),
    label: singleLine({
      label: 'The unit label',
      max: 160,
      required: 'Name the unit (e.g. "Basement furnace").',
      missing: 'Name the unit.',
    }),
    ignition: z.enum(['two-rod', 'single-rod'], { error: 'Ignition is two-rod or single-rod.' }),
    fuel: z.enum(['natural-gas', 'lp'], { error: 'Fuel is natural-gas or lp.' }),
    controlSupply: z.enum(['24v', 'line'], { error: 'Control supply is 24v or line.' }),
    // Optional, so that clients written before it keep working: most DSI furnaces are induced-draft.
    draft: z.enum(['induced', 'natural'], { error: 'Draft is induced or natural.' }).default('induced'),
    transformerVa: wholeNumber({
      label: 'The transformer rating',
      min: 10,
      max: 500,
      required: 'Enter the transformer rating in VA.',
      notNumber: 'Enter the transformer rating in VA as a number, e.g. 40.',
      notWhole: 'Enter a whole number of VA.',
      tooSmall: 'A control transformer is at least 10 VA.',
      tooLarge: 'Control transformers above 500 VA are not furnace controls.',
    }),
    installYear: optionalWholeNumber({
      label: 'The install year',
      min: 1950,
      max: thisYear,
      notNumber: 'Enter a year in digits, e.g. 2011, or leave it empty.',
      notWhole: 'Enter a year.',
      tooSmall: 'Enter a year from 1950 on.',
      tooLarge: 'The install year cannot be in the future.',
    }),
  },
  { error: objectError('the unit') },
);
export type UnitInput = z.infer<typeof unitSchema>;

export const CALL_STATUSES = ['open', 'diagnosing', 'repaired', 'closed', 'referred'] as const;
export type CallStatus = (typeof CALL_STATUSES)[number];

export const callSchema = z.object(
  {
    unitId: z.uuid({ error: 'Choose a unit.' }),
    complaint: multiLine({ label: 'The complaint', max: 1000, required: 'Describe the complaint.' }),
    // The form's "Not assigned yet" option is the empty string: no technician, like null.
    technicianId: z
      .union([z.uuid({ error: 'Choose a technician.' }), z.literal(''), z.null()], { error: 'Choose a technician.' })
      .optional()
      .transform((v) => (v === '' ? null : v)),
  },
  { error: objectError('the service call') },
);
export type CallInput = z.infer<typeof callSchema>;

export const callFilterSchema = z.object(
  {
    status: z.enum(CALL_STATUSES, { error: `status is one of: ${CALL_STATUSES.join(', ')}.` }).optional(),
    technician: z
      .union([z.uuid({ error: 'technician must be a user id or "me".' }), z.literal('me')], {
        error: 'technician must be a user id or "me".',
      })
      .optional(),
  },
  { error: objectError('the filter') },
);

export const startDiagnosisSchema = z.object(
  {
    treeVersionId: z.uuid({ error: 'Choose a published tree version.' }),
  },
  { error: objectError('the diagnosis to start') },
);

export const answerSchema = z.strictObject(
  {
    clientId: z.uuid({ error: 'clientId must be a UUID made by the client.' }),
    stepId: singleLine({ label: 'stepId', max: 200, required: 'stepId is required.', trim: false }),
    text: singleLine({ label: 'The reading', max: 100, trim: false }).optional(),
    unit: singleLine({ label: 'The unit of the reading', max: 20, trim: false }).optional(),
    choice: singleLine({ label: 'The choice', max: 100, trim: false }).optional(),
    confirmed: z.boolean({ error: 'confirmed is true or false.' }).optional(),
    /** An ohms reading over the meter's range ("OL", an open circuit), sent without text or value. */
    overRange: z.literal(true, { error: 'overRange is true, or left out.' }).optional(),
    /** What the technician notes with a choice (a status light against the control's legend). */
    note: multiLine({ label: 'The note', max: 500 }).optional(),
  },
  { error: objectError('the answer') },
);
export type AnswerInput = z.infer<typeof answerSchema>;

/**
 * Correcting what the unit record says of the facts a tree branches on, when the technician finds
 * it wrong at the unit. At least one fact; each as in `unitSchema`.
 */
export const unitFactsShape = {
  ignition: z.enum(['two-rod', 'single-rod'], { error: 'Ignition is two-rod or single-rod.' }).optional(),
  fuel: z.enum(['natural-gas', 'lp'], { error: 'Fuel is natural-gas or lp.' }).optional(),
  controlSupply: z.enum(['24v', 'line'], { error: 'Control supply is 24v or line.' }).optional(),
  draft: z.enum(['induced', 'natural'], { error: 'Draft is induced or natural.' }).optional(),
};

/** "None of these fits" / "I can't take this reading": the diagnosis goes to the leads with this note. */
export const escalateSchema = z.strictObject(
  {
    note: multiLine({
      label: 'The note',
      max: 1000,
      required: 'Say what you saw, or why the reading cannot be taken, so a lead can pick it up.',
    }),
  },
  { error: objectError('the escalation') },
);

export const repairSchema = z.object(
  {
    repairNotes: multiLine({ label: 'The repair notes', max: 4000, required: 'Describe the repair.' }),
    cycles: wholeNumber({
      label: 'The number of heat cycles',
      min: 0,
      max: 50,
      required: 'Enter how many heat cycles you ran.',
      notNumber: 'Enter the heat cycles as a number, e.g. 3.',
      notWhole: 'Enter a whole number of cycles.',
      tooSmall: 'The number of cycles cannot be negative.',
      tooLarge: 'At most 50 cycles.',
    }),
    flameSignal: singleLine({ label: 'The flame signal', max: 40 }).optional(),
    checks: z
      .array(
        z.object(
          {
            // Kept exactly as sent: it is matched against the finding's own check texts.
            text: singleLine({ label: 'A check', max: 300, trim: false }),
            done: z.boolean({ error: 'Each check is done (true) or not (false).' }),
          },
          { error: objectError('each check') },
        ),
        { error: 'The checks are a list of { text, done }.' },
      )
      // A refinement, not .max(): that would also measure a string sent in place of the list.
      .refine((list) => list.length <= 30, { error: 'The checklist is at most 30 checks.' })
      .default([]),
    notes: multiLine({ label: 'The notes', max: 2000 }).optional(),
  },
  { error: objectError('the repair') },
);
export type RepairInput = z.infer<typeof repairSchema>;

const REASON_MAX = 1000;

export const closeCallSchema = z
  .object(
    {
      outcome: z.enum(['closed', 'referred'], { error: 'Close the call, or refer it.' }).default('closed'),
      /** Why the call is referred: the office acts on it. Kept with the call's record; ignored for a close. */
      reason: multiLine({ label: 'The reason', max: REASON_MAX }).optional(),
    },
    { error: objectError('the outcome') },
  )
  .refine((v) => v.outcome !== 'referred' || Boolean(v.reason), {
    path: ['reason'],
    error: 'Say why you refer the call, e.g. "needs a new heat exchanger, office to quote".',
    when: (payload) => payload.issues.length === 0,
  });
export type CloseCallInput = z.infer<typeof closeCallSchema>;

export const reopenCallSchema = z.object(
  {
    reason: multiLine({ label: 'The reason', max: REASON_MAX, required: 'Say why the call is reopened.' }),
  },
  { error: objectError('the reopening') },
);
export type ReopenCallInput = z.infer<typeof reopenCallSchema>;

export const assignCallSchema = z.object(
  {
    technicianId: z.uuid({ error: 'Choose a technician from the list.' }),
  },
  { error: objectError('the assignment') },
);
export type AssignCallInput = z.infer<typeof assignCallSchema>;

/** A sign-off of a finding, with what the one signing off has to say about it (optional). */
export const signOffSchema = z.object(
  {
    comment: multiLine({ label: 'The comment', max: REASON_MAX }).optional(),
  },
  { error: objectError('the sign-off') },
);
export type SignOffInput = z.infer<typeof signOffSchema>;
