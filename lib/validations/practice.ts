// Practice scenarios, assignments and attempts: what trainers and apprentices send, and what the
// practice operations answer. Forms and server share the input schemas; the client takes its types
// from the output schemas (`z.output<…>`).
import { z } from 'zod';
import { POINTS } from '@/lib/bench/points';
import { answerResultSchema, apiAnswerSchema } from '@/lib/validations/api';
import { answerSchema } from '@/lib/validations/field';
import { multiLine, objectError, singleLine } from '@/lib/validations/text';

/** A date on the wire, ISO 8601 (a Date on the server). */
const isoDate = z.union([z.date(), z.string()]).transform((d) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString()));

/** The unit the bench simulates, as the bench API takes it. */
export const unitProfileSchema = z.object(
  {
    controlSupply: z.enum(['24v', 'line'], { error: 'Control supply is 24v or line.' }),
    ignition: z.enum(['two-rod', 'single-rod'], { error: 'Ignition is two-rod or single-rod.' }),
    fuel: z.enum(['natural-gas', 'lp'], { error: 'Fuel is natural-gas or lp.' }),
    draft: z.enum(['induced', 'natural'], { error: 'Draft is induced or natural.' }).default('induced'),
  },
  { error: objectError('the unit profile') },
);
export type UnitProfile = z.output<typeof unitProfileSchema>;

const faultId = z
  .string({ error: 'A fault id is text.' })
  .max(100, { error: 'A fault id is at most 100 characters.' })
  .regex(/^[a-z0-9-]+$/, { error: 'A fault id is lower-case letters, digits and dashes.' });

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;
const dueOn = z
  .union([z.string({ error: 'The due date is a date (YYYY-MM-DD).' }), z.null()])
  .optional()
  .transform((v) => (v === '' || v === undefined ? null : v))
  .refine((v) => v === null || (DATE_ONLY.test(v) && !Number.isNaN(Date.parse(`${v}T00:00:00Z`))), {
    error: 'The due date is a date (YYYY-MM-DD).',
  });

export const createScenarioSchema = z.strictObject(
  {
    title: singleLine({ label: 'The title', max: 160, required: 'Give the scenario a title.' }),
    faultIds: z
      .array(faultId, { error: 'Choose the fault, or several to pick one from at random.' })
      .min(1, { error: 'Choose at least one fault.' })
      .max(50, { error: 'At most 50 faults in one scenario.' })
      .refine((ids) => new Set(ids).size === ids.length, { error: 'A fault is listed twice.' }),
    unit: unitProfileSchema,
    notes: multiLine({ label: 'The notes', max: 2000 }).default(''),
    dueOn,
  },
  { error: objectError('the scenario') },
);
export type CreateScenarioInput = z.input<typeof createScenarioSchema>;

export const assignScenarioSchema = z.strictObject(
  {
    apprenticeIds: z
      .array(z.uuid({ error: 'Choose apprentices from the list.' }), { error: 'Choose one or more apprentices.' })
      .min(1, { error: 'Choose one or more apprentices.' })
      .max(200, { error: 'At most 200 apprentices at once.' }),
  },
  { error: objectError('the assignment') },
);

export const finishAttemptSchema = z.strictObject(
  {
    findingStepId: z
      .string({ error: 'Choose the finding you reached.' })
      .min(1, { error: 'Choose the finding you reached.' })
      .max(100, { error: 'A finding id is at most 100 characters.' }),
  },
  { error: objectError('the finding') },
);

// ── Outputs ─────────────────────────────────────────────────────────────────────────────────────

export const scoreLineSchema = z.object({
  key: z.enum(['finding', 'path', 'safety', 'time']),
  label: z.string(),
  points: z.number(),
  max: z.number(),
  detail: z.string(),
});

export const scoreSchema = z.object({
  total: z.number(),
  max: z.number(),
  lines: z.array(scoreLineSchema),
  safetyLapses: z.array(z.string()),
  measurements: z.number(),
  shortest: z.number(),
  seconds: z.number(),
});
export type ScoreOutput = z.output<typeof scoreSchema>;

export const practiceEventSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('action'),
    time: z.number(),
    action: z.enum(['power-on', 'power-off', 'call-for-heat', 'end-call', 'reset-rollout', 'wait']),
    seconds: z.number().optional(),
  }),
  z.object({
    kind: z.literal('measure'),
    time: z.number(),
    mode: z.enum(['vac', 'vdc', 'ohm', 'udc', 'gauge']),
    a: z.string().optional(),
    b: z.string().optional(),
    lead: z.string().optional(),
    series: z.string().optional(),
    gauge: z.string().optional(),
    value: z.number().nullable(),
  }),
  z.object({ kind: z.literal('observe'), time: z.number(), what: z.string(), result: z.string() }),
]);
export type PracticeEventOutput = z.output<typeof practiceEventSchema>;

export const faultChoiceSchema = z.object({ id: z.string(), title: z.string(), description: z.string() });
export type FaultChoice = z.output<typeof faultChoiceSchema>;

export const findingChoiceSchema = z.object({ id: z.string(), title: z.string() });
export type FindingChoice = z.output<typeof findingChoiceSchema>;

export const apprenticeSchema = z.object({ id: z.string(), name: z.string(), email: z.string() });
export type ApprenticeOutput = z.output<typeof apprenticeSchema>;

export const scenarioSchema = z.object({
  id: z.string(),
  title: z.string(),
  faultIds: z.array(z.string()),
  unit: unitProfileSchema,
  notes: z.string(),
  dueOn: z.string().nullable(),
  trainerName: z.string().nullable(),
  createdAt: isoDate,
  assigned: z.number(),
  attempts: z.number(),
  finished: z.number(),
});
export type ScenarioOutput = z.output<typeof scenarioSchema>;

/** One attempt as a row of a results table. */
export const attemptRowSchema = z.object({
  id: z.string(),
  scenarioId: z.string(),
  scenarioTitle: z.string(),
  apprenticeId: z.string(),
  apprenticeName: z.string(),
  faultId: z.string(),
  faultTitle: z.string(),
  findingStepId: z.string().nullable(),
  findingTitle: z.string().nullable(),
  right: z.boolean().nullable(),
  total: z.number().nullable(),
  max: z.number().nullable(),
  seconds: z.number().nullable(),
  safetyLapses: z.number().nullable(),
  startedAt: isoDate,
  finishedAt: isoDate.nullable(),
});
export type AttemptRow = z.output<typeof attemptRowSchema>;

export const scenarioDetailSchema = z.object({
  scenario: scenarioSchema,
  faults: z.array(faultChoiceSchema),
  assignments: z.array(z.object({ id: z.string(), apprentice: apprenticeSchema, assignedAt: isoDate })),
  attempts: z.array(attemptRowSchema),
});
export type ScenarioDetail = z.output<typeof scenarioDetailSchema>;

/** An apprentice's assignment: what to run and how the last try went. The fault is not named. */
export const assignmentSchema = z.object({
  id: z.string(),
  scenarioId: z.string(),
  title: z.string(),
  notes: z.string(),
  unit: unitProfileSchema,
  dueOn: z.string().nullable(),
  apprentice: apprenticeSchema,
  assignedAt: isoDate,
  attempts: z.number(),
  openAttemptId: z.string().nullable(),
  lastScore: z.object({ total: z.number(), max: z.number(), finishedAt: isoDate }).nullable(),
});
export type AssignmentOutput = z.output<typeof assignmentSchema>;

export const startedAttemptSchema = z.object({ id: z.string(), benchSessionId: z.string() });

/**
 * One attempt in full. For the apprentice while it runs: no fault, no expected finding. Once it is
 * finished, and for trainers, leads and admins: the fault, the finding expected, the path and the score.
 */
export const attemptSchema = z.object({
  id: z.string(),
  scenarioId: z.string(),
  title: z.string(),
  notes: z.string(),
  unit: unitProfileSchema,
  apprentice: apprenticeSchema,
  benchSessionId: z.string(),
  startedAt: isoDate,
  finishedAt: isoDate.nullable(),
  findings: z.array(findingChoiceSchema),
  finding: findingChoiceSchema.nullable(),
  fault: faultChoiceSchema.nullable(),
  /** The findings that isolate the fault (any one of them is right); empty while the apprentice runs it. */
  expectedFindings: z.array(findingChoiceSchema),
  events: z.array(practiceEventSchema),
  score: scoreSchema.nullable(),
  /**
   * The tree version the attempt walks in the wizard and the answers so far; null for an attempt
   * started without one (its finding is then reported by hand).
   */
  walk: z
    .object({
      treeVersionId: z.string(),
      title: z.string(),
      version: z.number(),
      path: z.array(apiAnswerSchema),
    })
    .nullable(),
});
export type AttemptOutput = z.output<typeof attemptSchema>;

export const progressSchema = z.object({
  apprentice: apprenticeSchema,
  attempts: z.array(attemptRowSchema),
  /** Faults the apprentice has isolated (the right finding at least once), with their best score. */
  isolated: z.array(z.object({ faultId: z.string(), faultTitle: z.string(), best: z.number(), times: z.number() })),
  /** Their real diagnoses at a finding that no technician has signed off yet. */
  awaitingSignOff: z.array(z.object({ diagnosisId: z.string(), findingTitle: z.string(), site: z.string(), at: isoDate })),
});
export type ProgressOutput = z.output<typeof progressSchema>;

export const practiceOverviewSchema = z.object({
  scenarios: z.array(scenarioSchema),
  apprentices: z.array(apprenticeSchema),
  faults: z.array(faultChoiceSchema),
  attempts: z.array(attemptRowSchema),
});
export type PracticeOverview = z.output<typeof practiceOverviewSchema>;

// ── The bench API as the bench screen reads it (the contract of issue 9) ────────────────────────

/** Every circuit point of the bench (lib/bench/points.ts, the bench API's contract and its additions). */
export const BENCH_POINTS = POINTS;
export type BenchPoint = (typeof BENCH_POINTS)[number];
export const SERIES_POINTS = ['flame-rod-lead', 'ground-lead'] as const;
export type SeriesPoint = (typeof SERIES_POINTS)[number];

export const BENCH_ACTIONS = ['power-on', 'power-off', 'call-for-heat', 'end-call', 'reset-rollout', 'wait'] as const;
export type BenchAction = (typeof BENCH_ACTIONS)[number];
export type MeterMode = 'vac' | 'vdc' | 'ohm' | 'udc';

export const benchStateSchema = z.object({
  id: z.string(),
  time: z.number(),
  sequenceState: z.string(),
  powered: z.boolean(),
  calling: z.boolean(),
});
export type BenchState = z.output<typeof benchStateSchema>;
export const benchActionReplySchema = z.object({ time: z.number(), sequenceState: z.string() });
export const benchMeasureReplySchema = z.object({ value: z.number().nullable(), unit: z.string(), time: z.number() });
export type BenchMeasureReply = z.output<typeof benchMeasureReplySchema>;
export const benchObserveReplySchema = z.object({ result: z.string(), time: z.number() });
export type BenchObserveReply = z.output<typeof benchObserveReplySchema>;

// ── The bench of one attempt (the apprentice's own, while it runs) ─────────────────────────────

const benchPoint = z.string({ error: 'Name the test point.' }).max(40, { error: 'A test point id is at most 40 characters.' });
export const attemptActionSchema = z.strictObject(
  {
    action: z.enum(BENCH_ACTIONS, { error: `The action is one of ${BENCH_ACTIONS.join(', ')}.` }),
    seconds: z
      .number({ error: 'Seconds are a number.' })
      .finite({ error: 'Seconds are a number.' })
      .min(0, { error: 'Wait at least 0 seconds.' })
      .max(7200, { error: 'Wait at most 7200 seconds at once.' })
      .optional(),
  },
  { error: objectError('the action') },
);
export const attemptMeasureSchema = z.union(
  [
    z.strictObject({ mode: z.enum(['vac', 'vdc', 'ohm']), a: benchPoint, b: benchPoint }),
    z.strictObject({ mode: z.literal('ohm'), lead: benchPoint }),
    z.strictObject({ mode: z.literal('udc'), series: benchPoint }),
    z.strictObject({ mode: z.literal('gauge'), gauge: benchPoint }),
  ],
  {
    error: 'A measurement is { mode: vac | vdc | ohm, a, b }, { mode: ohm, lead }, { mode: udc, series } or { mode: gauge, gauge }.',
  },
);
/** One answer of a practice walk: the wizard's answer (the same fields as a diagnosis's). */
export const practiceAnswerSchema = answerSchema;

/** What saving a practice answer says: the wizard's answer result, and whether it ended and scored the attempt. */
export const practiceAnswerResultSchema = answerResultSchema.extend({ scored: z.boolean() });
export type PracticeAnswerResult = z.output<typeof practiceAnswerResultSchema>;

export const attemptObserveSchema = z.strictObject(
  {
    what: z
      .string({ error: 'Say what to look at.' })
      .min(1, { error: 'Say what to look at.' })
      .max(40, { error: 'At most 40 characters.' }),
  },
  { error: objectError('the observation') },
);
