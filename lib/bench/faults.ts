// The bench's fault library: data, read by small hooks in the model (lib/bench/circuit.ts and
// lib/bench/bench.ts), never special cases scattered through the simulator. A fault says what it
// changes — an element of the circuit open or of another resistance, a failed output of the control,
// where the spark goes, the gas, the flame, what a look at a part shows — and which finding a tree
// should reach for it (its `expectedFindingTags`, matched against the tags of the finding reached).
//
// What each fault does to a furnace is common practice, no source (TRADE.md: the DSI sequence, the
// safety circuit, flame rectification and the gas valve); the numbers below are the bench's own
// model values, chosen to sit clearly inside the default tree's bands, not figures of the trade.
import type { ObservationKind, ObservationResult } from '@/lib/bench/points';

/** Two-terminal parts of the bench's circuit that a fault can break open or change. */
export const ELEMENTS = [
  'feed-hot',
  'feed-neutral',
  'ground-wire',
  'xfmr-primary',
  'fuse',
  'stat-contact',
  'high-limit',
  'rollout',
  'common-wire',
  'valve-wire',
  'valve-return',
  'inducer-motor',
  'ps-switch',
  'flame-rod-lead',
  'ground-lead',
  'spark-lead',
  'rod-insulation',
] as const;
export type ElementId = (typeof ELEMENTS)[number];

export type Looks = { [K in ObservationKind]?: ObservationResult<K> };

export interface FaultEffect {
  /** Elements broken open (a blown fuse, an open switch, a broken wire). */
  open?: readonly ElementId[];
  /** Elements of another resistance than a healthy unit's, in ohms (a corroded connection, a leak). */
  resistance?: Partial<Record<ElementId, number>>;
  /** Hot and neutral swapped on the supply to the unit. */
  reversedPolarity?: boolean;
  /** Outputs of the control that do not work. */
  control?: { spark?: false; valveOutput?: false; inducerOutput?: false; sensesFlame?: false };
  /** Where the spark goes instead of the gap. */
  spark?: 'heard-not-seen' | 'to-frame';
  /** The spark gap, in inches (healthy: about 1/8 in). */
  sparkGapIn?: number;
  gas?: {
    /** Inlet pressure as a fraction of the healthy supply (0 for gas off at the meter or the shut-off). */
    inletFactor?: number;
    /** Inlet pressure above the appliance's maximum, in inWC; the valve does not open against it. */
    inletInWC?: number;
    /** The valve does not open with voltage on its coil. */
    valveOpens?: false;
    /** Debris or insects in the orifices: no flame at the burners. */
    orificesBlocked?: true;
  };
  flame?: {
    /** The flame does not carry across to the sensing side (no current through the rod). */
    carriesOver?: false;
    /** Flame current as a fraction of a healthy one (a dirty rod, rust on the burner). */
    signalFactor?: number;
  };
  /** The pressure switch stays open with the inducer running (hose, port, vent, a failed switch). */
  pressureSwitchOpen?: true;
  /** A tripped rollout switch whose cause persists: reset, it trips again once flame runs a while. */
  rolloutRetrips?: true;
  /** What a look at a part shows instead of the healthy result. */
  looks?: Looks;
}

export interface Fault {
  id: string;
  title: string;
  /** For trainers: what is wrong on the bench, what the apprentice should see, where the tree should end. */
  description: string;
  /** Tags the finding a tree reaches for this fault must carry (all of them). */
  expectedFindingTags: readonly string[];
  /** Unit profiles the fault exists on (an inducer fault needs an induced-draft unit). */
  requires?: { draft?: 'induced' | 'natural'; ignition?: 'two-rod' | 'single-rod' };
  effect: FaultEffect;
}

export const FAULTS: readonly Fault[] = [
  {
    id: 'no-line-power',
    title: 'No line power to the unit',
    description:
      'The supply to the unit is dead upstream (a tripped breaker or an open service switch fuse). Nothing runs; 0 V from line hot to neutral.',
    expectedFindingTags: ['power', 'no-line-power'],
    effect: { open: ['feed-hot'] },
  },
  {
    id: 'open-transformer',
    title: 'Open control transformer',
    description: 'The transformer primary winding is open: 120 V on the primary, 0 V on the 24 V secondary.',
    expectedFindingTags: ['power', 'open-transformer'],
    effect: { open: ['xfmr-primary'] },
  },
  {
    id: 'blown-fuse',
    title: 'Blown control fuse',
    description: 'The low-voltage fuse is open (after a short in the control circuit): 24 V at xfmr-hot, 0 V at fuse-out.',
    expectedFindingTags: ['power', 'blown-fuse'],
    effect: { open: ['fuse'] },
  },
  {
    id: 'no-call-for-heat',
    title: 'No call for heat reaches the furnace',
    description: 'The thermostat shows a call but its R–W circuit stays open (a failed thermostat or a broken W wire): 0 V at W.',
    expectedFindingTags: ['thermostat', 'no-call-for-heat'],
    effect: { open: ['stat-contact'] },
  },
  {
    id: 'reversed-polarity',
    title: 'Reversed line polarity',
    description:
      'Hot and neutral are swapped at the unit. The burners light but the control cannot prove flame, so it drops out each trial: about 120 V from neutral to ground.',
    expectedFindingTags: ['power', 'reversed-polarity'],
    effect: { reversedPolarity: true, control: { sensesFlame: false } },
  },
  {
    id: 'lost-ground',
    title: 'Lost equipment ground',
    description:
      'The equipment ground is open between the panel and the unit. The burners light and drop out (no ground reference for flame sensing); hot to ground reads far below line voltage.',
    expectedFindingTags: ['power', 'lost-ground'],
    effect: { open: ['ground-wire'], control: { sensesFlame: false } },
  },
  {
    id: 'no-inducer-output',
    title: 'Control does not power the inducer',
    description: 'The control never energizes its inducer output on a call: the inducer stays still, 0 V at inducer-hot, no trial.',
    expectedFindingTags: ['draft', 'no-inducer-output'],
    requires: { draft: 'induced' },
    effect: { control: { inducerOutput: false } },
  },
  {
    id: 'inducer-motor-failed',
    title: 'Inducer motor failed',
    description: 'Line voltage reaches the inducer but the motor does not turn: the pressure switch never closes, no trial.',
    expectedFindingTags: ['draft', 'inducer-motor'],
    requires: { draft: 'induced' },
    effect: { open: ['inducer-motor'] },
  },
  {
    id: 'pressure-hose-blocked',
    title: 'Pressure switch hose blocked or split',
    description: 'The inducer runs but the pressure switch stays open: 24 V across it. The hose is kinked, split or full of water.',
    expectedFindingTags: ['draft', 'pressure-hose'],
    requires: { draft: 'induced' },
    effect: { pressureSwitchOpen: true, looks: { 'pressure-hose': 'faulty' } },
  },
  {
    id: 'pressure-port-blocked',
    title: 'Pressure switch port blocked',
    description: 'The inducer runs, the hose is sound, but the port on the inducer housing is plugged: the switch stays open.',
    expectedFindingTags: ['draft', 'pressure-port-blocked'],
    requires: { draft: 'induced' },
    effect: { pressureSwitchOpen: true, looks: { 'pressure-port': 'blocked' } },
  },
  {
    id: 'vent-blocked',
    title: 'Vent blocked',
    description: 'The flue or intake is blocked (a nest, ice): the inducer runs but cannot pull the draft that closes the pressure switch.',
    expectedFindingTags: ['draft', 'vent-blocked'],
    requires: { draft: 'induced' },
    effect: { pressureSwitchOpen: true, looks: { vent: 'blocked' } },
  },
  {
    id: 'pressure-switch-failed',
    title: 'Pressure switch failed open',
    description: 'Hose, port and vent are clear and the inducer runs, but the switch contact never closes.',
    expectedFindingTags: ['draft', 'pressure-switch-failed'],
    requires: { draft: 'induced' },
    effect: { pressureSwitchOpen: true },
  },
  {
    id: 'open-high-limit',
    title: 'Open high limit',
    description:
      'The high limit is open (overheated: a dead blower, a clogged filter): 24 V across the limit, 0 V at the thermostat input.',
    expectedFindingTags: ['safety-circuit', 'open-high-limit'],
    effect: { open: ['high-limit'] },
  },
  {
    id: 'tripped-rollout',
    title: 'Tripped rollout switch',
    description:
      'The manual-reset rollout switch is open because flame rolled out (a blocked flue). Reset without finding the cause, it trips again once the burners run a while. DANGER: the cause is a combustion hazard.',
    expectedFindingTags: ['safety-circuit', 'tripped-rollout'],
    effect: { open: ['rollout'], rolloutRetrips: true },
  },
  {
    id: 'broken-spark-lead',
    title: 'Broken spark lead (sparking inside)',
    description: 'The spark lead is broken inside its insulation: the control ticks but no spark shows at the gap.',
    expectedFindingTags: ['spark', 'broken-spark-lead'],
    effect: { open: ['spark-lead'], spark: 'heard-not-seen', looks: { 'spark-lead': 'broken' } },
  },
  {
    id: 'cracked-lead-insulation',
    title: 'Cracked spark lead insulation (arcing to the frame)',
    description: 'The spark lead insulation is cracked where it passes the cabinet: the spark jumps to the frame instead of the gap.',
    expectedFindingTags: ['spark', 'cracked-lead-insulation'],
    effect: { spark: 'to-frame', looks: { arcing: 'lead-insulation' } },
  },
  {
    id: 'spark-gap-wide',
    title: 'Spark gap too wide (rod bent)',
    description: 'The spark rod is bent away: a weak spark at a gap of about 1/4 in that does not light the gas.',
    expectedFindingTags: ['spark', 'spark-gap'],
    effect: { sparkGapIn: 0.25, looks: { 'spark-rod': 'bent' } },
  },
  {
    id: 'control-not-sparking',
    title: 'Control not sparking',
    description: 'Power, call and safety circuit are all good, but the control never produces a spark (a failed spark circuit).',
    expectedFindingTags: ['spark', 'control-not-sparking'],
    effect: { control: { spark: false } },
  },
  {
    id: 'no-valve-output',
    title: 'No valve voltage from the control',
    description: 'The control sparks but never powers its valve output: 0 V at the valve during the trial.',
    expectedFindingTags: ['gas-valve', 'no-valve-voltage'],
    effect: { control: { valveOutput: false } },
  },
  {
    id: 'valve-wiring-resistance',
    title: 'Low valve voltage from wiring resistance',
    description:
      'A corroded connection in the valve common wire drops several volts under load: the valve sees well under the secondary during the trial and does not pull in.',
    expectedFindingTags: ['gas-valve', 'valve-wiring-resistance'],
    effect: { resistance: { 'valve-return': 25 } },
  },
  {
    id: 'gas-valve-not-opening',
    title: 'Gas valve not opening with 24 V',
    description:
      'The valve gets its 24 V during the trial and the inlet pressure is right, but the valve stays shut: no manifold pressure.',
    expectedFindingTags: ['gas-valve', 'valve-not-opening'],
    effect: { gas: { valveOpens: false } },
  },
  {
    id: 'no-gas',
    title: 'No gas (supply off or very low)',
    description: 'The manual shut-off is closed upstream: inlet pressure near zero, spark without flame.',
    expectedFindingTags: ['gas-supply', 'no-gas'],
    effect: { gas: { inletFactor: 0.05 } },
  },
  {
    id: 'inlet-over-pressure',
    title: "Inlet pressure above the appliance's maximum",
    description: 'The supply regulator has failed high: the inlet reads well above the maximum and this valve will not open against it.',
    expectedFindingTags: ['gas-supply', 'inlet-over-pressure'],
    effect: { gas: { inletInWC: 18 } },
  },
  {
    id: 'blocked-orifices',
    title: 'Blocked orifices',
    description: 'Debris or insects block the burner orifices: valve open, manifold pressure right, no flame at the burners.',
    expectedFindingTags: ['gas-supply', 'blocked-orifices'],
    effect: { gas: { orificesBlocked: true }, looks: { orifices: 'blocked' } },
  },
  {
    id: 'rusted-carry-over',
    title: 'Rusted carry-over',
    description:
      'The first burner lights at the spark but rust in the carry-over keeps flame from reaching the sensing side: it drops each trial.',
    expectedFindingTags: ['burner', 'rusted-carry-over'],
    effect: { flame: { carriesOver: false }, looks: { 'carry-over': 'rusted' } },
  },
  {
    id: 'dirty-flame-rod',
    title: 'Dirty or oxidized flame rod',
    description: 'An oxide coat on the flame rod keeps the flame current well under the control’s minimum: the burners light and drop.',
    expectedFindingTags: ['flame-signal', 'dirty-flame-rod'],
    effect: { flame: { signalFactor: 0.08 }, looks: { 'flame-rod': 'dirty' } },
  },
  {
    id: 'cracked-rod-ceramic',
    title: 'Cracked flame rod ceramic',
    description:
      'The flame rod’s ceramic is cracked and leaks the rod voltage to the bracket: the flame signal is too low and the burners drop.',
    expectedFindingTags: ['flame-signal', 'cracked-rod-ceramic'],
    effect: { resistance: { 'rod-insulation': 150_000 }, flame: { signalFactor: 0.1 }, looks: { 'flame-rod': 'ceramic-cracked' } },
  },
  {
    id: 'burner-surface-rust',
    title: 'Rust on the burner where the flame touches it',
    description: 'Scale on the burner surface the flame sits on lowers the flame current: the burners light and drop.',
    expectedFindingTags: ['flame-signal', 'burner-surface-rust'],
    effect: { flame: { signalFactor: 0.1 }, looks: { 'burner-surface': 'rusted' } },
  },
  {
    id: 'flame-lead-open',
    title: 'Open flame-rod lead',
    description: 'The flame-rod lead is broken inside its insulation: no flame current, the lead reads open end to end.',
    expectedFindingTags: ['flame-signal', 'flame-lead-open'],
    effect: { open: ['flame-rod-lead'] },
  },
  {
    id: 'open-ground-lead',
    title: 'Open or loose flame ground lead',
    description:
      'The flame ground lead is off its terminal: no return path for the flame current; the burner reads open to the control ground.',
    expectedFindingTags: ['flame-signal', 'open-ground-lead'],
    effect: { open: ['ground-lead'] },
  },
  {
    id: 'control-not-sensing',
    title: 'Control not sensing a good signal',
    description: 'A good flame current flows (several µA) but the control drops the valve anyway: its flame-sense circuit has failed.',
    expectedFindingTags: ['control', 'control-not-sensing'],
    effect: { control: { sensesFlame: false } },
  },
];

const BY_ID = new Map(FAULTS.map((f) => [f.id, f]));

export function getFault(id: string): Fault | undefined {
  return BY_ID.get(id);
}

export const FAULT_IDS = FAULTS.map((f) => f.id);

/** Whether a fault exists on a unit profile (an inducer fault needs an induced-draft unit). */
export function faultFits(fault: Fault, unit: { draft: 'induced' | 'natural'; ignition: 'two-rod' | 'single-rod' }): boolean {
  if (fault.requires?.draft && fault.requires.draft !== unit.draft) return false;
  if (fault.requires?.ignition && fault.requires.ignition !== unit.ignition) return false;
  return true;
}
