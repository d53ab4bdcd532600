// The bench API of issue 9: what a client sends and what the bench answers. Forms and server share
// the input schemas; the client takes its types from the output schemas (`z.output<…>`).
import { z } from 'zod';
import { BENCH_ACTIONS, MAX_WAIT_SECONDS, OBSERVATION_KINDS } from '@/lib/bench';
import { objectError } from '@/lib/validations/text';

const pointId = z
  .string({ error: 'A test point is its id, e.g. line-hot.' })
  .min(1, { error: 'Say which test point.' })
  .max(40, { error: 'A test point id is at most 40 characters.' });

export const benchUnitSchema = z.strictObject(
  {
    controlSupply: z.enum(['24v', 'line'], { error: 'Control supply is 24v or line.' }),
    ignition: z.enum(['two-rod', 'single-rod'], { error: 'Ignition is two-rod or single-rod.' }),
    fuel: z.enum(['natural-gas', 'lp'], { error: 'Fuel is natural-gas or lp.' }),
    draft: z.enum(['induced', 'natural'], { error: 'Draft is induced or natural.' }).default('induced'),
  },
  { error: objectError('the unit') },
);

export const createBenchSessionSchema = z.strictObject(
  {
    faultId: z
      .union([z.string().max(100, { error: 'A fault id is at most 100 characters.' }), z.null()], {
        error: 'The fault is a fault id or null.',
      })
      .default(null),
    unit: benchUnitSchema,
    seed: z
      .number({ error: 'The seed is a whole number.' })
      .int({ error: 'The seed is a whole number.' })
      .min(0, { error: 'The seed is 0 or more.' })
      .max(2_147_483_647, { error: 'The seed is at most 2147483647.' })
      .optional(),
  },
  { error: objectError('the bench session') },
);

export const benchActionSchema = z
  .strictObject(
    {
      action: z.enum(BENCH_ACTIONS, { error: `The action is one of ${BENCH_ACTIONS.join(', ')}.` }),
      seconds: z
        .number({ error: 'Seconds is a number.' })
        .positive({ error: 'Wait more than 0 seconds.' })
        .max(MAX_WAIT_SECONDS, { error: `Wait at most ${MAX_WAIT_SECONDS} seconds at a time.` })
        .optional(),
    },
    { error: objectError('the action') },
  )
  .refine((a) => a.action === 'wait' || a.seconds === undefined, { error: 'Only "wait" takes seconds.', path: ['seconds'] });

export const benchMeasureSchema = z.union(
  [
    z.strictObject({ mode: z.enum(['vac', 'vdc', 'ohm']), a: pointId, b: pointId }),
    z.strictObject({ mode: z.literal('udc'), series: pointId }),
    z.strictObject({ mode: z.literal('ohm'), lead: pointId }),
    // An extension of the contract: a gauge (manometer on the valve's taps, gap gauge), as a practice attempt's bench has.
    z.strictObject({ mode: z.literal('gauge'), gauge: pointId }),
  ],
  { error: 'A measurement is { mode: vac | vdc | ohm, a, b }, { mode: ohm, lead }, { mode: udc, series } or { mode: gauge, gauge }.' },
);

export const benchObserveSchema = z.strictObject(
  { what: z.enum(OBSERVATION_KINDS as [string, ...string[]], { error: 'Observe spark or flame.' }) },
  { error: objectError('the observation') },
);

// ── Outputs ─────────────────────────────────────────────────────────────────────────────────────

export const benchSessionCreatedSchema = z.object({ id: z.string() });
export const benchStateOutSchema = z.object({
  id: z.string(),
  time: z.number(),
  sequenceState: z.string(),
  powered: z.boolean(),
  calling: z.boolean(),
  /** Only for trainers, leads and admins. */
  fault: z.object({ id: z.string(), title: z.string(), description: z.string() }).nullable().optional(),
});
export type BenchStateOut = z.output<typeof benchStateOutSchema>;
export const benchActionOutSchema = z.object({ time: z.number(), sequenceState: z.string() });
export const benchReadingOutSchema = z.object({ value: z.number().nullable(), unit: z.string(), time: z.number() });
export const benchObservationOutSchema = z.object({ result: z.string(), time: z.number() });
export const benchFaultOutSchema = z.object({
  id: z.string(),
  title: z.string().optional(),
  description: z.string().optional(),
  expectedFindingTags: z.array(z.string()).optional(),
});
export type BenchFaultOut = z.output<typeof benchFaultOutSchema>;
