// The bench: a simulated DSI furnace with at most one injected fault. The control's own sequence is
// the ignition-sequence machine (machines/ignition-sequence-machine.ts) running on a simulated clock;
// the bench turns what the sequence is doing (sparking, valve powered, rod powered, running) and the
// bench's switches into the electrical model (lib/bench/circuit.ts) and answers meter readings,
// gauges and observations as they would be on a real unit at that moment. Meter noise comes from a
// generator seeded by the session's seed and the reading's number, so a replay reads the same.
import { createActor, type Actor } from 'xstate';
import { createIgnitionSequenceMachine, DEFAULT_CONTROL_PROFILE, type ControlProfile } from '@/machines/ignition-sequence-machine';
import { buildCircuit, elementOhms, lineLive, nodeExists, type CircuitState, type NodeId } from '@/lib/bench/circuit';
import { BenchClock } from '@/lib/bench/clock';
import { getFault, type Fault, type FaultEffect } from '@/lib/bench/faults';
import { FLAME_TEST_PROFILES, type FlameTestMethodId } from '@/lib/trees/control-profiles';
import {
  FLAME_TEST_POINTS,
  GAUGES,
  INDUCED_DRAFT_POINTS,
  LEADS,
  METER_UNITS,
  OBSERVATIONS,
  POINT_LABELS,
  SERIES_LABELS,
  TWO_ROD_POINTS,
  type BenchAction,
  type GaugeId,
  type LeadId,
  type MeterMode,
  type ObservationKind,
  type ObservationResult,
  type PointId,
} from '@/lib/bench/points';

export interface BenchUnit {
  controlSupply: '24v' | 'line';
  ignition: 'two-rod' | 'single-rod';
  fuel: 'natural-gas' | 'lp';
  draft: 'induced' | 'natural';
}

export const DEFAULT_BENCH_UNIT: BenchUnit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' };

export type MeasureRequest =
  { mode: 'vac' | 'vdc' | 'ohm'; a: string; b: string } | { mode: 'ohm'; lead: string } | { mode: 'udc'; series: string };

export interface Reading {
  /** null: over range (OL on the display). */
  value: number | null;
  unit: string;
  /** Simulated seconds since the session began. */
  time: number;
}

export interface BenchSnapshot {
  time: number;
  sequenceState: string;
  powered: boolean;
  calling: boolean;
}

/** A reading or action the bench cannot take, with why (the API answers 400 with the message). */
export class BenchRefusal extends Error {
  readonly reason: 'unknown-point' | 'not-on-this-unit' | 'power-on' | 'power-off' | 'not-series' | 'spark' | 'invalid';
  constructor(reason: BenchRefusal['reason'], message: string) {
    super(message);
    this.name = 'BenchRefusal';
    this.reason = reason;
  }
}

// Model values of the bench, not figures of the trade: they sit inside the default tree's bands.
/** A healthy flame current, µA (TRADE.md: a few microamps is a good signal, common practice, no source). */
const HEALTHY_MICROAMPS = 4.2;
/** The bench control's own minimum to prove flame, µA (below the 2 µA "getting low" of TRADE.md). */
const CONTROL_MINIMUM_MICROAMPS = 0.8;
/** The valve pulls in at this coil voltage. */
const VALVE_PULL_IN_VOLTS = 18;
/** Supply pressures (inWC): natural gas about 7 inlet / 3.5 manifold, LP about 12 / 10.5 (TRADE.md: common practice, no source). */
const GAS = {
  'natural-gas': { inlet: 7, manifold: 3.5, minInlet: 4.5, maxInlet: 14 },
  lp: { inlet: 12, manifold: 10.5, minInlet: 11, maxInlet: 14 },
} as const;
/** About 1/8 in (TRADE.md: common practice, no source). */
const HEALTHY_GAP_IN = 0.125;
const WIDEST_LIGHTING_GAP_IN = 0.16;
/** A rollout whose cause persists trips again this long after the burners light. */
const ROLLOUT_RETRIP_MS = 20_000;
/** Longest single wait. */
export const MAX_WAIT_SECONDS = 7200;

export interface Bench {
  readonly unit: BenchUnit;
  readonly fault: Fault | null;
  readonly seed: number;
  snapshot(): BenchSnapshot;
  act(action: BenchAction, seconds?: number): { time: number; sequenceState: string };
  measure(request: MeasureRequest): Reading;
  gauge(id: GaugeId): Reading;
  observe<K extends ObservationKind>(what: K): { result: ObservationResult<K>; time: number };
  /** The state of the sequence (tags of the ignition machine) and of the flame, for the screen and tests. */
  status(): BenchStatus;
  /** Seconds until the control's next timed step (the end of a purge, a trial…), or null when none is pending. */
  nextEventIn(): number | null;
}

export interface BenchStatus extends BenchSnapshot {
  controlPowered: boolean;
  sparking: boolean;
  valvePowered: boolean;
  rodPowered: boolean;
  flame: boolean;
  flameProven: boolean;
  inducerRunning: boolean;
  trial: number;
}

export interface CreateBenchOptions {
  unit?: Partial<BenchUnit>;
  faultId?: string | null;
  seed?: number;
  profile?: Partial<ControlProfile>;
  /**
   * The control's own flame-signal test (lib/trees/control-profiles.ts): test terminals read in DC
   * volts (the default) or a status light read against its legend.
   */
  flameTest?: FlameTestMethodId;
}

// Building the sequence machine is far dearer than starting an actor of it: one per control profile.
const MACHINES = new Map<string, ReturnType<typeof createIgnitionSequenceMachine>>();
function sequenceMachineFor(profile: ControlProfile) {
  const key = JSON.stringify(profile);
  let machine = MACHINES.get(key);
  if (!machine) MACHINES.set(key, (machine = createIgnitionSequenceMachine(profile)));
  return machine;
}

export function createBench({
  unit: unitIn,
  faultId = null,
  seed = 1,
  profile: profileIn,
  flameTest = 'dc-test-terminals',
}: CreateBenchOptions = {}): Bench {
  const unit: BenchUnit = { ...DEFAULT_BENCH_UNIT, ...unitIn };
  const fault = faultId === null ? null : (getFault(faultId) ?? null);
  if (faultId !== null && !fault) throw new BenchRefusal('invalid', `There is no fault "${faultId}" in the bench's library.`);
  const effect: FaultEffect | undefined = fault?.effect;
  const profile: ControlProfile = { ...DEFAULT_CONTROL_PROFILE, linePowered: unit.controlSupply === 'line', ...profileIn };
  const clock = new BenchClock();
  const gas = GAS[unit.fuel];

  let powered = false;
  let calling = false;
  let rolloutReset = false;
  let readings = 0;
  let actor: Actor<ReturnType<typeof createIgnitionSequenceMachine>> | null = null;
  let callSent = false;
  let safetySent: boolean | null = null;
  let wasRunning = false;
  // What the technician could have seen since the call began: a spark (at the gap or off it), flame.
  let seenSpark = false;
  let seenFlame = false;
  const flameTestProfile = FLAME_TEST_PROFILES[flameTest];
  if (!flameTestProfile) throw new BenchRefusal('invalid', `There is no flame-signal test "${String(flameTest)}".`);

  // What does not change over the session: does the gas light at the valve, is the flame proven.
  const inletInWC = effect?.gas?.inletInWC ?? gas.inlet * (effect?.gas?.inletFactor ?? 1);
  const gasReachesBurners = inletInWC >= gas.minInlet * 0.5 && inletInWC <= gas.maxInlet && effect?.gas?.valveOpens !== false;
  const sparkAtGap = effect?.control?.spark !== false && effect?.spark === undefined && elementOhms(effect, 'spark-lead') < Infinity;
  const gapIn = effect?.sparkGapIn ?? HEALTHY_GAP_IN;
  const microampsWithFlame =
    effect?.flame?.carriesOver === false ||
    elementOhms(effect, 'flame-rod-lead') === Infinity ||
    elementOhms(effect, 'ground-lead') === Infinity
      ? 0
      : HEALTHY_MICROAMPS * (effect?.flame?.signalFactor ?? 1);

  const state = (): CircuitState => {
    const tags = actor?.getSnapshot();
    const has = (t: Parameters<NonNullable<typeof tags>['hasTag']>[0]) => (controlPowered() && tags ? tags.hasTag(t) : false);
    const thLive = callReachesControl();
    const inducerRelay = unit.draft === 'induced' && thLive && controlPowered() && effect?.control?.inducerOutput !== false;
    return {
      switchClosed: powered,
      calling,
      inducerRelay,
      psFeed: unit.draft === 'induced' && thLive && controlPowered(),
      valveRelay: has('valve-powered') && effect?.control?.valveOutput !== false,
      rodPowered: has('rod-powered'),
      psClosed: inducerRelay && elementOhms(effect, 'inducer-motor') < Infinity && effect?.pressureSwitchOpen !== true,
      rolloutClosed: rolloutReset,
    };
  };

  const secondaryLive = () => lineLive(effect, { switchClosed: powered }) && elementOhms(effect, 'xfmr-primary') < Infinity;
  const pastFuse = () => secondaryLive() && elementOhms(effect, 'fuse') < Infinity;
  /** A 24 V control runs off the secondary past the fuse; a line-powered one off the line. */
  const controlPowered = () => (unit.controlSupply === 'line' ? lineLive(effect, { switchClosed: powered }) : pastFuse());
  const wLive = () => pastFuse() && calling && elementOhms(effect, 'stat-contact') < Infinity;
  const rolloutClosedNow = () => rolloutReset || elementOhms(effect, 'rollout') < Infinity;
  const callReachesControl = () => wLive() && elementOhms(effect, 'high-limit') < Infinity && rolloutClosedNow();
  const draftProven = () => {
    if (unit.draft === 'natural') return true;
    const s = state();
    return s.psClosed;
  };

  // The fault and the unit are fixed for the session, so a reading depends only on the circuit's
  // switches and relays: solved once per state and pair of points.
  const solved = new Map<string, number>();
  const voltsAt = (s: CircuitState, a: NodeId, b: NodeId): number => {
    const key = `${+s.switchClosed}${+s.calling}${+s.inducerRelay}${+s.psFeed}${+s.valveRelay}${+s.rodPowered}${+s.psClosed}${+s.rolloutClosed} ${a} ${b}`;
    let v = solved.get(key);
    if (v === undefined) solved.set(key, (v = buildCircuit(effect, s, unit).volts(a, b)));
    return v;
  };
  const valveVolts = (): number => {
    const s = state();
    if (!s.valveRelay) return 0;
    return voltsAt(s, 'valve-hot', 'valve-common');
  };
  // Whether the burners light when the valve is powered during a trial.
  const lightsWithValve = () => gasReachesBurners && effect?.gas?.orificesBlocked !== true && sparkAtGap && gapIn <= WIDEST_LIGHTING_GAP_IN;

  const flameProves = () => {
    if (!lightsWithValve() || effect?.control?.sensesFlame === false) return false;
    // The coil voltage with the valve relay closed decides whether the valve pulls in.
    const s: CircuitState = { ...state(), switchClosed: true, calling: true, valveRelay: true };
    const coil = buildCircuit(effect, s, unit).volts('valve-hot', 'valve-common');
    return coil >= VALVE_PULL_IN_VOLTS && microampsWithFlame >= CONTROL_MINIMUM_MICROAMPS;
  };
  const provesOnThisUnit = flameProves();

  const snapshotTags = () => (actor && controlPowered() ? actor.getSnapshot() : null);
  const flameNow = () => {
    const snap = snapshotTags();
    if (!snap || !snap.hasTag('valve-powered')) return false;
    return lightsWithValve() && valveVolts() >= VALVE_PULL_IN_VOLTS;
  };

  const sync = () => {
    // Keep the machine's inputs in step with the circuit: the call reaching the control, the safety
    // circuit and proven draft. Events are sent only on a change.
    if (!actor) return;
    const safety = callReachesControl() && draftProven();
    const reach = wLive();
    if (reach && !callSent) {
      if (safety !== safetySent) actor.send({ type: safety ? 'safety.close' : 'safety.open' });
      safetySent = safety;
      actor.send({ type: 'call.start' });
      callSent = true;
    } else if (!reach && callSent) {
      actor.send({ type: 'call.end' });
      callSent = false;
    }
    if (callSent && safety !== safetySent) {
      actor.send({ type: safety ? 'safety.close' : 'safety.open' });
      safetySent = safety;
    }
    const snap = actor.getSnapshot();
    if (controlPowered() && snap.hasTag('spark') && effect?.control?.spark !== false && effect?.spark !== 'heard-not-seen')
      seenSpark = true;
    if (flameNow()) seenFlame = true;
    const running = snap.matches('running');
    if (running && !wasRunning && effect?.rolloutRetrips && rolloutReset) {
      clock.setTimeout(() => {
        rolloutReset = false;
        sync();
      }, ROLLOUT_RETRIP_MS);
    }
    wasRunning = running;
  };

  const startControl = () => {
    clock.clearAll();
    actor?.stop();
    actor = createActor(sequenceMachineFor(profile), {
      clock,
      input: { safetyClosed: true, flameProves: provesOnThisUnit },
    });
    actor.subscribe(() => sync());
    actor.start();
    callSent = false;
    safetySent = true;
    wasRunning = false;
    sync();
  };

  const stopControl = () => {
    actor?.stop();
    actor = null;
    clock.clearAll();
    callSent = false;
    safetySent = null;
    wasRunning = false;
  };

  const time = () => clock.now() / 1000;

  const sequenceState = (): string => {
    const snap = snapshotTags();
    if (!snap) return 'off';
    const value = snap.value;
    if (typeof value === 'string') return value;
    return Object.entries(value)
      .map(([k, v]) => `${k}.${String(v)}`)
      .join(',');
  };

  const snapshot = (): BenchSnapshot => ({ time: time(), sequenceState: sequenceState(), powered, calling });

  const status = (): BenchStatus => {
    const snap = snapshotTags();
    const s = state();
    return {
      ...snapshot(),
      controlPowered: controlPowered(),
      sparking: snap?.hasTag('spark') ?? false,
      valvePowered: s.valveRelay,
      rodPowered: s.rodPowered,
      flame: flameNow(),
      flameProven: snap?.matches('running') ?? false,
      inducerRunning: s.psClosed || (s.inducerRelay && elementOhms(effect, 'inducer-motor') < Infinity),
      trial: snap?.context.trial ?? 0,
    };
  };

  // Seeded noise: mulberry32 over the seed and the reading's number.
  const noise = (): number => {
    let t = (seed ^ Math.imul(++readings, 0x9e3779b1)) >>> 0;
    t = (t + 0x6d2b79f5) >>> 0;
    let r = Math.imul(t ^ (t >>> 15), 1 | t);
    r = (r + Math.imul(r ^ (r >>> 7), 61 | r)) ^ r;
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296 - 0.5;
  };
  const display = (value: number, digits: number) => Math.round(value * 10 ** digits) / 10 ** digits;

  const checkPoint = (p: string): PointId => {
    if (!(p in POINT_LABELS) || !nodeExists(p)) throw new BenchRefusal('unknown-point', `"${p}" is not a point on the bench's circuit.`);
    const id = p as PointId;
    if (unit.draft === 'natural' && INDUCED_DRAFT_POINTS.includes(id))
      throw new BenchRefusal('not-on-this-unit', `A natural-draft unit has no inducer or pressure switch: there is no ${p} to measure.`);
    if (unit.ignition === 'single-rod' && TWO_ROD_POINTS.includes(id))
      throw new BenchRefusal('not-on-this-unit', 'A single-rod unit senses flame on its spark rod: there is no separate flame rod.');
    return id;
  };

  /** The control's flame-signal test terminals: DC volts following the flame current (its profile). */
  const flameTestReading = (mode: MeterMode, a: string, b: string): Reading => {
    if (flameTestProfile.method !== 'dc-volts')
      throw new BenchRefusal(
        'not-on-this-unit',
        'This control has no flame-signal test terminals: read its status light against its legend.',
      );
    if (!(FLAME_TEST_POINTS as readonly string[]).includes(a) || !(FLAME_TEST_POINTS as readonly string[]).includes(b) || a === b)
      throw new BenchRefusal('invalid', 'Put the meter leads on the two flame-signal test terminals of the control (+ and −).');
    if (mode === 'ohm') {
      if (powered) throw powerOnForOhms();
      return ohmsReading(Infinity);
    }
    const s = state();
    const ua = flameNow() && s.rodPowered ? microampsWithFlame : 0;
    const sign = a === 'flame-test-plus' ? 1 : -1;
    if (mode === 'vac') return { value: display(Math.abs(0.02 * noise()), 2), unit: METER_UNITS.vac, time: time() };
    if (mode !== 'vdc') throw new BenchRefusal('invalid', 'The flame-signal test terminals are read in DC volts.');
    const volts = ua * flameTestProfile.voltsPerMicroamp * (1 + 0.01 * noise()) + 0.01 * noise();
    return { value: display(sign * volts, 2), unit: METER_UNITS.vdc, time: time() };
  };

  const measure = (request: MeasureRequest): Reading => {
    const mode = request.mode as MeterMode;
    if (!(mode in METER_UNITS)) throw new BenchRefusal('invalid', `The meter has no "${String(mode)}" function.`);
    const unitSymbol = METER_UNITS[mode];
    if ('a' in request && mode !== 'udc') {
      const onTest =
        (FLAME_TEST_POINTS as readonly string[]).includes(request.a) || (FLAME_TEST_POINTS as readonly string[]).includes(request.b);
      if (onTest) return flameTestReading(mode, request.a, request.b);
    }
    if (mode === 'udc') {
      if (!('series' in request))
        throw new BenchRefusal('not-series', 'Microamps are read with the meter in series: open a lead and put the meter in it.');
      const series = request.series;
      if (!(series in SERIES_LABELS))
        throw new BenchRefusal(
          'unknown-point',
          `"${series}" is not a lead the meter can be put in series with (flame-rod-lead or ground-lead).`,
        );
      if (unit.ignition === 'single-rod')
        throw new BenchRefusal(
          'spark',
          'On a single-rod unit the flame-rod lead carries the spark: never put a meter in it. Use the control’s own flame-signal test.',
        );
      const s = state();
      const ua = flameNow() && s.rodPowered ? microampsWithFlame : 0;
      const value = Math.max(0, ua * (1 + 0.01 * noise()) + 0.01 * noise());
      return { value: display(value, 2), unit: unitSymbol, time: time() };
    }
    if ('lead' in request) {
      if (mode !== 'ohm') throw new BenchRefusal('invalid', 'A lead end to end is read in ohms.');
      if (!(LEADS as readonly string[]).includes(request.lead))
        throw new BenchRefusal('unknown-point', `"${request.lead}" is not a lead on the bench.`);
      if (powered) throw powerOnForOhms();
      const r = elementOhms(effect, request.lead as LeadId);
      return ohmsReading(r);
    }
    if (!('a' in request)) throw new BenchRefusal('invalid', 'Say which two points the leads go on.');
    const a = checkPoint(request.a);
    const b = checkPoint(request.b);
    const s = state();
    if (mode === 'ohm') {
      if (powered) throw powerOnForOhms();
      return ohmsReading(buildCircuit(effect, s, unit).ohms(a as NodeId, b as NodeId));
    }
    if ((a === 'spark-rod' || b === 'spark-rod') && snapshotTags()?.hasTag('spark'))
      throw new BenchRefusal(
        'spark',
        'The spark rod is at about 10 kV while the control sparks: a meter lead on it now would be destroyed. Wait until the sparking stops.',
      );
    if (mode === 'vdc') {
      // The unit is all AC: a DC range reads about nothing but its own offset.
      return { value: display(0.02 * noise(), 2), unit: unitSymbol, time: time() };
    }
    const v = voltsAt(s, a as NodeId, b as NodeId);
    const value = Math.abs(v * (1 + 0.004 * noise()) + 0.06 * noise());
    return { value: display(value, 1), unit: unitSymbol, time: time() };
  };

  const powerOnForOhms = () =>
    new BenchRefusal(
      'power-on',
      'Ohms only with the power off: an ohmmeter on a live circuit reads nonsense and can be damaged. Power off and verify first.',
    );

  const ohmsReading = (r: number): Reading => {
    if (!Number.isFinite(r)) {
      noise();
      return { value: null, unit: 'Ω', time: time() };
    }
    const value = Math.max(0, r * (1 + 0.005 * noise()) + 0.1 * Math.abs(noise()));
    return { value: display(value, value < 1000 ? 1 : 0), unit: 'Ω', time: time() };
  };

  const gauge = (id: GaugeId): Reading => {
    const g = GAUGES[id];
    if (!g) throw new BenchRefusal('invalid', `The bench has no "${String(id)}" gauge.`);
    let value: number;
    if (id === 'spark-gap') {
      if (powered) throw new BenchRefusal('power-on', 'Measure the spark gap with the power off: the spark is about 10 kV.');
      value = gapIn * (1 + 0.02 * noise());
      return { value: display(value, 3), unit: g.unit, time: time() };
    }
    // With the valve shut the inlet reads the supply; flowing, a little less.
    const open = flameNow() || (state().valveRelay && valveVolts() >= VALVE_PULL_IN_VOLTS && gasReachesBurners);
    if (id === 'inlet-pressure') value = open ? inletInWC - 0.3 : inletInWC;
    else value = open ? Math.min(gas.manifold, inletInWC - 0.5) : 0;
    value = Math.max(0, value + 0.05 * noise());
    return { value: display(value, 1), unit: g.unit, time: time() };
  };

  const observe = <K extends ObservationKind>(what: K): { result: ObservationResult<K>; time: number } => {
    const spec = OBSERVATIONS[what];
    if (!spec) throw new BenchRefusal('invalid', `The bench has no "${String(what)}" observation.`);
    if (spec.power === 'off' && powered)
      throw new BenchRefusal('power-on', 'Power off and verify de-energized before handling rods, leads or the burner.');
    const result = observeNow(what) as ObservationResult<K>;
    return { result, time: time() };
  };

  const observeNow = (what: ObservationKind): string => {
    const looked = effect?.looks?.[what];
    const snap = snapshotTags();
    switch (what) {
      case 'spark': {
        if (!snap?.hasTag('spark') || effect?.control?.spark === false) return 'none';
        return effect?.spark ?? 'at-gap';
      }
      case 'flame':
        if (!flameNow()) return 'none';
        return effect?.flame?.carriesOver === false ? 'partial' : 'all-burners';
      case 'inducer':
        return status().inducerRunning ? 'runs' : 'not-running';
      case 'thermostat':
        return calling ? 'calling' : 'not-calling';
      case 'flame-test': {
        if (!flameNow()) return 'none';
        if (microampsWithFlame >= 2) return 'good';
        return microampsWithFlame > 0.1 ? 'weak' : 'none';
      }
      case 'trial': {
        if (flameNow() && snap?.matches('running')) return 'stays-lit';
        if (seenFlame) return 'lights-drops';
        return seenSpark ? 'spark-no-flame' : 'no-spark';
      }
      case 'flame-test-method':
        return flameTestProfile.id;
      default:
        return looked ?? OBSERVATIONS[what].results[0];
    }
  };

  const act = (action: BenchAction, seconds?: number) => {
    switch (action) {
      case 'power-on':
        if (!powered) {
          powered = true;
          seenSpark = false;
          seenFlame = false;
          if (controlPowered()) startControl();
        }
        break;
      case 'power-off':
        if (powered) {
          powered = false;
          stopControl();
        }
        break;
      case 'call-for-heat':
        if (!calling) {
          seenSpark = false;
          seenFlame = false;
        }
        calling = true;
        sync();
        break;
      case 'end-call':
        calling = false;
        sync();
        break;
      case 'reset-rollout':
        if (elementOhms(effect, 'rollout') === Infinity && !rolloutReset) {
          rolloutReset = true;
          sync();
        }
        break;
      case 'wait': {
        const s = seconds ?? 1;
        if (!Number.isFinite(s) || s <= 0 || s > MAX_WAIT_SECONDS)
          throw new BenchRefusal('invalid', `Wait between 0 and ${MAX_WAIT_SECONDS} seconds.`);
        clock.advanceTo(clock.now() + Math.round(s * 1000));
        break;
      }
      default:
        throw new BenchRefusal('invalid', `The bench has no "${String(action)}" action.`);
    }
    return { time: time(), sequenceState: sequenceState() };
  };

  const nextEventIn = (): number | null => {
    const due = clock.nextDue();
    return due === null ? null : Math.max(0, due - clock.now()) / 1000;
  };

  return {
    unit,
    fault,
    seed,
    snapshot,
    act,
    measure,
    gauge,
    observe,
    status,
    nextEventIn,
  };
}
