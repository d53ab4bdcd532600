// The shape of a fault-tree version's graph. Shared by the validator, the machine compiler, the
// server (every save and every seed parses through it) and the authoring forms.
import { z } from 'zod';

/** Quantities a measure step can ask for. Each has one canonical unit (see CANONICAL_UNITS). */
export const QUANTITIES = ['vac', 'vdc', 'udc', 'ohm', 'length', 'pressure'] as const;
export const quantitySchema = z.enum(QUANTITIES);
export type Quantity = z.infer<typeof quantitySchema>;

/** Canonical unit symbol per quantity: band limits and stored values are in these units. */
export const CANONICAL_UNITS: Record<Quantity, string> = {
  vac: 'VAC',
  vdc: 'VDC',
  udc: 'µA',
  ohm: 'Ω',
  length: 'in',
  pressure: 'inWC',
};

/**
 * The energy state a step needs. `any` is for steps that do not care (a look at the thermostat
 * display, a finding's summary). The diagnosis inserts the lock-out or re-energize procedure
 * whenever the next step needs the other state.
 */
export const ENERGY_STATES = ['energized', 'locked-out'] as const;
export const energyNeedSchema = z.enum(['energized', 'locked-out', 'any']);
export type EnergyState = (typeof ENERGY_STATES)[number];
export type EnergyNeed = z.infer<typeof energyNeedSchema>;

/** ANSI Z535 signal words, most severe first. */
export const SIGNAL_WORDS = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'] as const;
export const signalWordSchema = z.enum(SIGNAL_WORDS);
export type SignalWord = z.infer<typeof signalWordSchema>;

export const stepIdSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, 'Step ids are lower-case letters, digits and dashes');

export const cautionSchema = z.object({
  signal: signalWordSchema,
  text: z.string().trim().min(1, 'A caution needs its text'),
});
export type Caution = z.infer<typeof cautionSchema>;

/** Where a reading lies relative to what a healthy unit shows: drives the gauge's word and icon. */
export const verdictSchema = z.enum(['below', 'within', 'above']);
export type Verdict = z.infer<typeof verdictSchema>;

/**
 * One band of a measure step, in the quantity's canonical unit. `from` is inclusive, `to` is
 * exclusive; a missing limit is open (minus or plus infinity).
 */
export const bandSchema = z.object({
  from: z.number().finite().optional(),
  to: z.number().finite().optional(),
  label: z.string().trim().min(1, 'A band needs a label'),
  verdict: verdictSchema,
  outcome: stepIdSchema,
});
export type Band = z.infer<typeof bandSchema>;

const stepBase = {
  id: stepIdSchema,
  title: z.string().trim().min(1, 'A step needs a title'),
  instruction: z.string().trim().default(''),
  cautions: z.array(cautionSchema).default([]),
  /** A note for learners: why this step comes here. */
  why: z.string().trim().optional(),
  energy: energyNeedSchema,
};

/** Computation aids the wizard offers beside a measure step. */
export const AIDS = ['voltage-drop', 'transformer-load'] as const;

export const measureStepSchema = z.object({
  ...stepBase,
  kind: z.literal('measure'),
  quantity: quantitySchema,
  /** The two test points the meter goes between (for microamps: the meter in series between them). */
  points: z.tuple([z.string().trim().min(1), z.string().trim().min(1)]),
  bands: z.array(bandSchema).min(1, 'A measure step needs at least one band'),
  /** Where the default bands come from, shown beside them ("default — common practice, a lead can change"). */
  bandsNote: z.string().trim().optional(),
  aids: z.array(z.enum(AIDS)).default([]),
});

export const choiceSchema = z.object({
  value: stepIdSchema,
  label: z.string().trim().min(1, 'A choice needs a label'),
  outcome: stepIdSchema,
});

export const inspectStepSchema = z.object({
  ...stepBase,
  kind: z.literal('inspect'),
  choices: z.array(choiceSchema).min(2, 'An inspect step needs at least two choices'),
});

export const actionStepSchema = z.object({
  ...stepBase,
  kind: z.literal('action'),
  /** Items the user ticks before confirming (e.g. the parts of a lock-out). */
  checklist: z.array(z.string().trim().min(1)).default([]),
  outcome: stepIdSchema,
});

/** A reading a finding expects: a recorded reading of `step` outside [from, to) contradicts the finding. */
export const expectationSchema = z.object({
  step: stepIdSchema,
  from: z.number().finite().optional(),
  to: z.number().finite().optional(),
  reason: z.string().trim().min(1),
});
export type Expectation = z.infer<typeof expectationSchema>;

export const findingStepSchema = z.object({
  ...stepBase,
  kind: z.literal('finding'),
  explanation: z.string().trim().min(1),
  remedy: z.string().trim().min(1),
  parts: z.array(z.string().trim().min(1)).default([]),
  /** The checks that verify the repair (several heat cycles, flame signal after repair, …). */
  verification: z.array(z.string().trim().min(1)).min(1, 'A finding needs its verification checks'),
  tags: z.array(z.string().trim().min(1)).default([]),
  expects: z.array(expectationSchema).default([]),
});

export const stepSchema = z.discriminatedUnion('kind', [measureStepSchema, inspectStepSchema, actionStepSchema, findingStepSchema]);

export const treeGraphSchema = z.object({
  start: stepIdSchema,
  steps: z.array(stepSchema).min(1),
});

export type MeasureStep = z.infer<typeof measureStepSchema>;
export type InspectStep = z.infer<typeof inspectStepSchema>;
export type ActionStep = z.infer<typeof actionStepSchema>;
export type FindingStep = z.infer<typeof findingStepSchema>;
export type Step = z.infer<typeof stepSchema>;
export type StepKind = Step['kind'];
/** A graph as authored (defaults not yet applied). */
export type TreeGraphInput = z.input<typeof treeGraphSchema>;
/** A parsed graph, defaults applied. */
export type TreeGraph = z.infer<typeof treeGraphSchema>;

/** A tree version as the machine compiler and the server see it. */
export interface TreeVersion {
  id: string;
  version: number;
  graph: TreeGraph;
}
