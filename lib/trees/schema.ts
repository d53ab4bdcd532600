// The shape of a fault-tree version's graph. Shared by the validator, the machine compiler, the
// server (every save and every seed parses through it) and the authoring forms.
import { z } from 'zod';
import { GAUGES, LEADS, MOMENTS, OBSERVATIONS, POINTS, SERIES_POINTS, type ObservationKind } from '@/lib/bench/points';

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
 * Two energy sources: the electric supply (the unit's disconnect) and the gas (the appliance valve
 * and the manual shut-off). A step declares what it needs of each: `on`, `off`, or `any` (a look at
 * the thermostat display, a question the unit record answers). The diagnosis inserts the procedure
 * that changes what must change before the step (lock-out, gas off, gas on with a leak test,
 * re-energize). A finding's energy is what its repair needs.
 */
export const ENERGY_SOURCES = ['electric', 'gas'] as const;
export type EnergySource = (typeof ENERGY_SOURCES)[number];
export const sourceStateSchema = z.enum(['on', 'off']);
export const sourceNeedSchema = z.enum(['on', 'off', 'any']);
export type SourceState = z.infer<typeof sourceStateSchema>;
export type SourceNeed = z.infer<typeof sourceNeedSchema>;
export type EnergyState = Record<EnergySource, SourceState>;
export type EnergyNeed = Record<EnergySource, SourceNeed>;

/** The one-source form of the first tree revision: electricity only, gas unknown ("any"). */
const LEGACY_ENERGY: Record<string, EnergyNeed> = {
  energized: { electric: 'on', gas: 'any' },
  'locked-out': { electric: 'off', gas: 'any' },
  any: { electric: 'any', gas: 'any' },
};

export const energyNeedSchema = z.preprocess(
  (value) => (typeof value === 'string' && value in LEGACY_ENERGY ? LEGACY_ENERGY[value] : value),
  z.object({ electric: sourceNeedSchema, gas: sourceNeedSchema }),
);

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
export const bandSchema = z
  .object({
    from: z.number().finite().optional(),
    to: z.number().finite().optional(),
    label: z.string().trim().min(1, 'A band needs a label'),
    verdict: verdictSchema,
    /** The step a reading in this band leads to. */
    outcome: stepIdSchema.optional(),
    /**
     * Instead of an outcome: a reading here is not taken (leads reversed, wrong meter function),
     * and the technician is told this and measures again.
     */
    askAgain: z.string().trim().min(1).optional(),
  })
  .refine((b) => (b.outcome === undefined) !== (b.askAgain === undefined), {
    message: 'A band needs either an outcome or an "ask again" message, not both',
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
  /**
   * The energy sources of the parts this step has someone handle (open, remove, connect to). The
   * validator refuses a step that handles a source it does not need off.
   */
  handles: z.array(z.enum(ENERGY_SOURCES)).default([]),
  /**
   * The wizard shows the control's ignition sequence beside this step (a reading or a look whose
   * answer depends on when in the sequence it is taken). Left out: see `showsIgnitionTimeline`.
   */
  timeline: z.boolean().optional(),
};

/**
 * Where a measure step's reading is taken, in the bench's circuit vocabulary (lib/bench/points.ts):
 * the meter's two leads on two points, the meter in series in a lead (microamps), a lead's own
 * resistance end to end (ohms, disconnected), or a gauge (manometer, gap gauge). The human
 * description stays in `points`; this is what the bench, the isolation check and a practice
 * diagnosis answer from.
 */
export const probeSchema = z.union([
  z.object({ a: z.enum(POINTS as [string, ...string[]]), b: z.enum(POINTS as [string, ...string[]]) }).strict(),
  z.object({ series: z.enum(SERIES_POINTS as [string, ...string[]]) }).strict(),
  z.object({ lead: z.enum(LEADS) }).strict(),
  z.object({ gauge: z.enum(Object.keys(GAUGES) as [string, ...string[]]) }).strict(),
]);
export type Probe = z.infer<typeof probeSchema>;

/**
 * When in the control's sequence a reading or a look is taken: `now` (as the unit stands),
 * `call` (with a call for heat, before the trial), `proving` (during the trial for ignition),
 * `after-proving` (once the flame is proven and the unit runs).
 */
export const momentSchema = z.enum(MOMENTS);

/**
 * What an inspect step observes, machine-readably: the observation (lib/bench/points.ts), when, and
 * which of the step's choices each result means. The bench answers it in a practice diagnosis and in
 * the isolation check; a result left out of `choices` has no choice on this step.
 */
export const observationSchema = z.object({
  what: z.enum(Object.keys(OBSERVATIONS) as [ObservationKind, ...ObservationKind[]]),
  at: momentSchema.optional(),
  /** Result → the `value` of one of the step's choices. */
  choices: z.record(z.string(), stepIdSchema),
});
export type Observation = z.infer<typeof observationSchema>;

/** Computation aids the wizard offers beside a measure step. */
export const AIDS = ['voltage-drop', 'transformer-load'] as const;

export const measureStepSchema = z.object({
  ...stepBase,
  kind: z.literal('measure'),
  quantity: quantitySchema,
  /** The two test points the meter goes between (for microamps: the meter in series between them). */
  points: z.tuple([z.string().trim().min(1), z.string().trim().min(1)]),
  bands: z.array(bandSchema).min(1, 'A measure step needs at least one band'),
  /**
   * Bands relative to an earlier reading of the walk: each limit is added to that step's reading
   * (a valve voltage judged against the transformer secondary read just before). `fallback` stands
   * in when the walk did not take that reading.
   */
  reference: z.object({ step: stepIdSchema, fallback: z.number().finite() }).optional(),
  /** Where the default bands come from, shown beside them ("default — common practice, a lead can change"). */
  bandsNote: z.string().trim().optional(),
  aids: z.array(z.enum(AIDS)).default([]),
  probe: probeSchema.optional(),
  /** When in the sequence the reading is taken (see `momentSchema`); left out: `now`. */
  at: momentSchema.optional(),
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
  /** A note the technician writes with the choice (what a status light shows, against the control's own legend). */
  note: z.object({ label: z.string().trim().min(1), required: z.boolean().default(false) }).optional(),
  observe: observationSchema.optional(),
  /**
   * Further looks, in order, for a result of `observe` that maps to none of the choices (a step that
   * looks at the hose, then at the port): the first result that maps to a choice decides.
   */
  observeMore: z.array(observationSchema).optional(),
});

/** Facts of the unit record a tree can branch on, with the values each can take. */
export const UNIT_FACTS = {
  ignition: ['two-rod', 'single-rod'],
  fuel: ['natural-gas', 'lp'],
  controlSupply: ['24v', 'line'],
  draft: ['induced', 'natural'],
} as const;
export type UnitFact = keyof typeof UNIT_FACTS;
export type UnitFacts = { [F in UnitFact]: (typeof UNIT_FACTS)[F][number] };
export const unitFactSchema = z.enum(Object.keys(UNIT_FACTS) as [UnitFact, ...UnitFact[]]);

/**
 * A branch the unit record answers: no question is asked, the diagnosis takes the case of the
 * unit's fact and shows "from the unit record" on the path.
 */
export const factStepSchema = z.object({
  ...stepBase,
  kind: z.literal('fact'),
  fact: unitFactSchema,
  cases: z.array(choiceSchema).min(2, 'A unit-record branch needs a case for each value'),
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

export const stepSchema = z.discriminatedUnion('kind', [
  measureStepSchema,
  inspectStepSchema,
  actionStepSchema,
  factStepSchema,
  findingStepSchema,
]);

export const treeGraphSchema = z.object({
  start: stepIdSchema,
  steps: z.array(stepSchema).min(1),
  /**
   * Readings taken again after any repair, when the walk took them before (the flame signal), each
   * with the action step that sets the meter up again; they are saved like any reading.
   */
  afterRepair: z.array(z.object({ measure: stepIdSchema, reconnect: stepIdSchema.optional() })).default([]),
});

export type MeasureStep = z.infer<typeof measureStepSchema>;
export type InspectStep = z.infer<typeof inspectStepSchema>;
export type ActionStep = z.infer<typeof actionStepSchema>;
export type FindingStep = z.infer<typeof findingStepSchema>;
export type FactStep = z.infer<typeof factStepSchema>;
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

/**
 * The steps of the built-in tree's revisions 1 and 2 that show the ignition sequence: published
 * before steps said so themselves (`timeline`), and a published graph never changes. A step that
 * sets `timeline` decides for itself; this list answers only for a step that does not.
 */
const TIMELINE_BEFORE_THE_ATTRIBUTE: ReadonlySet<string> = new Set([
  'spark-observe',
  'valve-voltage',
  'control-valve-output',
  'inlet-pressure',
  'manifold-pressure',
  'lp-inlet-pressure',
  'lp-manifold-pressure',
  'burners-light',
]);

/** Whether the wizard shows the ignition sequence beside a step. */
export function showsIgnitionTimeline(step: { id: string; timeline?: boolean }): boolean {
  return step.timeline ?? TIMELINE_BEFORE_THE_ATTRIBUTE.has(step.id);
}
