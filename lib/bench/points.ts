// The bench's vocabulary: the circuit points a meter lead can touch, the leads a meter can be put in
// series with, and what a technician can observe. Plain data with no imports, so the tree schema
// (lib/trees) and the bench model both read it. The ids are the bench API's contract (issue 9).

/** Circuit points for the meter's two leads, with what each is on the unit. */
export const POINT_LABELS = {
  'line-hot': 'Line hot (L1) at the unit, load side of the service switch',
  'line-neutral': 'Line neutral at the unit',
  chassis: 'Cabinet (chassis)',
  'xfmr-hot': 'Transformer secondary, 24 V side (R)',
  'xfmr-common': 'Transformer secondary, common (C)',
  'fuse-out': 'Control fuse, load side (R past the fuse)',
  'stat-w': 'After the thermostat R–W contact (W)',
  'limit-out': 'After the high limit',
  'rollout-out': "After the rollout switch (the control's thermostat input, TH)",
  'control-common': 'Control common (TR)',
  'inducer-hot': "Control's inducer output (line side)",
  'ps-in': 'Pressure switch, supply side',
  'ps-out': 'Pressure switch, control side',
  'line-ground': 'Equipment ground at the unit',
  'valve-hot': 'Gas valve terminal (from the control valve output)',
  'valve-common': 'Gas valve common terminal',
  'spark-rod': 'Spark rod',
  'flame-rod': 'Flame rod',
  burner: 'Burner and its grounded frame',
  'ground-lead': 'Flame ground lead, control end',
  // Added after the first contract (additions only): the control's own valve output terminal, and
  // the flame-signal test terminals of a control that has them (read in DC volts, see
  // lib/trees/control-profiles.ts).
  'valve-out': "Control's valve output terminal (at the control)",
  'flame-test-plus': "Control's flame-signal test terminal (+)",
  'flame-test-minus': "Control's flame-signal test terminal (−)",
} as const;

export type PointId = keyof typeof POINT_LABELS;
export const POINTS = Object.keys(POINT_LABELS) as PointId[];

/** Where the meter can be put in series (DC microamps of the flame signal). */
export const SERIES_LABELS = {
  'flame-rod-lead': 'In series in the flame-rod lead',
  'ground-lead': 'In series in the flame ground lead',
} as const;

export type SeriesPointId = keyof typeof SERIES_LABELS;
export const SERIES_POINTS = Object.keys(SERIES_LABELS) as SeriesPointId[];

/** Leads whose own resistance can be read end to end, disconnected (ohms, power off). */
export const LEADS = ['flame-rod-lead', 'ground-lead', 'spark-lead'] as const;
export type LeadId = (typeof LEADS)[number];

/** Points that exist only on some units. */
export const INDUCED_DRAFT_POINTS: readonly PointId[] = ['inducer-hot', 'ps-in', 'ps-out'];
export const TWO_ROD_POINTS: readonly PointId[] = ['flame-rod'];
/** The control's flame-signal test terminals: on a control whose flame test is read in DC volts. */
export const FLAME_TEST_POINTS: readonly PointId[] = ['flame-test-plus', 'flame-test-minus'];

export const METER_MODES = ['vac', 'vdc', 'ohm', 'udc'] as const;
export type MeterMode = (typeof METER_MODES)[number];
export const METER_UNITS: Record<MeterMode, string> = { vac: 'VAC', vdc: 'VDC', ohm: 'Ω', udc: 'µA' };

/** Gauges other than the meter: a manometer on the gas valve's taps, a gap gauge on the spark gap. */
export const GAUGES = {
  'inlet-pressure': { label: 'Gas valve inlet pressure (manometer)', unit: 'inWC', quantity: 'pressure' },
  'manifold-pressure': { label: 'Gas valve outlet (manifold) pressure (manometer)', unit: 'inWC', quantity: 'pressure' },
  'spark-gap': { label: 'Spark gap (gap gauge)', unit: 'in', quantity: 'length' },
} as const;
export type GaugeId = keyof typeof GAUGES;

/**
 * What a technician can observe, with every result it can have. `spark` and `flame` are watched
 * with the unit running (the bench API's observe); the others are looks at a part — `inducer`,
 * `thermostat` and `flame-test` with power on, the rest with the power off (handling rods and leads);
 * `trial` is what the trial for ignition showed since the call began, `flame-test-method` which
 * flame-signal test the control's label and instructions give.
 */
export const OBSERVATIONS = {
  spark: { results: ['at-gap', 'heard-not-seen', 'to-frame', 'none'], power: 'on' },
  flame: { results: ['all-burners', 'partial', 'none'], power: 'on' },
  inducer: { results: ['runs', 'not-running'], power: 'on' },
  thermostat: { results: ['calling', 'not-calling'], power: 'any' },
  'flame-test': { results: ['good', 'weak', 'none'], power: 'on' },
  'spark-lead': { results: ['intact', 'broken'], power: 'off' },
  arcing: { results: ['none', 'lead-insulation', 'rod-ceramic', 'rod-bent'], power: 'off' },
  'spark-rod': { results: ['good', 'bent', 'ceramic-cracked'], power: 'off' },
  'flame-rod': { results: ['good', 'dirty', 'ceramic-cracked', 'out-of-flame'], power: 'off' },
  'pressure-hose': { results: ['good', 'faulty'], power: 'off' },
  'pressure-port': { results: ['clear', 'blocked'], power: 'off' },
  vent: { results: ['clear', 'blocked'], power: 'off' },
  'burner-surface': { results: ['clean', 'rusted'], power: 'off' },
  'carry-over': { results: ['clear', 'rusted'], power: 'off' },
  orifices: { results: ['clear', 'blocked'], power: 'off' },
  // What one trial for ignition showed, watched from the call (what was seen since the call began:
  // no spark seen, a spark but no flame, flame that went out, flame that holds).
  trial: { results: ['no-spark', 'spark-no-flame', 'lights-drops', 'stays-lit'], power: 'on' },
  // Which flame-signal test the control provides (its label and instructions).
  'flame-test-method': { results: ['dc-test-terminals', 'status-light'], power: 'any' },
} as const satisfies Record<string, { results: readonly string[]; power: 'on' | 'off' | 'any' }>;

export type ObservationKind = keyof typeof OBSERVATIONS;
export type ObservationResult<K extends ObservationKind = ObservationKind> = (typeof OBSERVATIONS)[K]['results'][number];
export const OBSERVATION_KINDS = Object.keys(OBSERVATIONS) as ObservationKind[];

/** When in the sequence an observation or reading is taken. */
export const MOMENTS = ['now', 'call', 'proving', 'after-proving'] as const;
export type Moment = (typeof MOMENTS)[number];

export const BENCH_ACTIONS = ['power-on', 'power-off', 'call-for-heat', 'end-call', 'reset-rollout', 'wait'] as const;
export type BenchAction = (typeof BENCH_ACTIONS)[number];
