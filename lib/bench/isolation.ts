// The isolation check: every fault of the bench's library run through a tree version, with the bench
// answering each step the way an automatic technician would take it — power on or off as the step
// needs, a call for heat and a wait to the moment the step reads at, the reading the probe names
// (the meter function from the step's quantity) or the observation, the band or choice it falls in,
// unit-record branches from the unit profile, actions to their outcome — until a finding. A fault is
// isolated when the finding reached carries every tag the fault expects (lib/bench/faults.ts).
//
// Plain TypeScript, no framework or database: the route, the tests and `npm run bench` run this.
// What it does not model: the gas shut-off. The bench's gas supply is always on (a fault decides its
// pressure); the technician's gas is followed from the steps' needs, and a step that would fire the
// burners or read a gas pressure with the gas left off stops the run.
import { findBand, shiftedBands } from '@/lib/bands';
import { BenchRefusal, createBench, DEFAULT_BENCH_UNIT, type Bench, type BenchUnit, type MeasureRequest } from '@/lib/bench/bench';
import { FAULTS, faultFits, getFault, type Fault } from '@/lib/bench/faults';
import { GAUGES, OBSERVATIONS, type GaugeId, type Moment, type ObservationKind } from '@/lib/bench/points';
import type { FlameTestMethodId } from '@/lib/trees/control-profiles';
import type { InspectStep, MeasureStep, Observation, Step, TreeGraph } from '@/lib/trees/schema';

export interface IsolationRow {
  faultId: string;
  expectedFindingTags: string[];
  /** The finding reached, or the step the run stopped at when it could not go on. */
  reachedStepId: string | null;
  ok: boolean;
  /** Why the run is not ok: the finding lacks tags, or a step the bench could not answer. */
  reason?: string;
  /** The unit profile the fault ran on. */
  unit: BenchUnit;
  /** The steps walked, in order, with the answer each got. */
  path: { stepId: string; answer: string }[];
}

export interface IsolationOptions {
  unit?: Partial<BenchUnit>;
  seed?: number;
  /** The bench control's own flame-signal test (single-rod units). */
  flameTest?: FlameTestMethodId;
}

/** The longest wait for a moment of the sequence (seconds): past a whole first trial of any default timing. */
const MAX_MOMENT_WAIT_S = 90;
const STEP_S = 0.5;
/** A reading that asks again is retaken this many times before the run gives up. */
const RETAKES = 2;

class Stop extends Error {}

/** Runs one fault through the graph. */
export function isolateFault(graph: TreeGraph, faultId: string, options: IsolationOptions = {}): IsolationRow {
  const unit: BenchUnit = { ...DEFAULT_BENCH_UNIT, ...options.unit };
  const fault = getFault(faultId);
  const path: IsolationRow['path'] = [];
  const row = (reachedStepId: string | null, ok: boolean, reason?: string): IsolationRow => ({
    faultId,
    expectedFindingTags: [...(fault?.expectedFindingTags ?? [])],
    reachedStepId,
    ok,
    ...(reason ? { reason } : {}),
    unit,
    path,
  });
  if (!fault) return row(null, false, `There is no fault "${faultId}" in the bench's library.`);
  if (!faultFits(fault, unit)) return row(null, false, `The fault "${faultId}" does not exist on this unit profile.`);

  const steps = new Map(graph.steps.map((s) => [s.id, s]));
  const bench = createBench({ unit, faultId, seed: options.seed ?? 1, flameTest: options.flameTest });
  const readings: Record<string, number> = {};
  let stepId = graph.start;
  let current: Step | undefined;
  try {
    for (let visits = 0; visits <= graph.steps.length; visits++) {
      current = steps.get(stepId);
      if (!current) return row(stepId, false, `The walk leads to "${stepId}", which is not a step of this tree.`);
      const step = current;
      if (step.kind === 'finding') {
        const missing = fault.expectedFindingTags.filter((t) => !step.tags.includes(t));
        return missing.length === 0
          ? row(step.id, true)
          : row(step.id, false, `The finding "${step.id}" lacks the tags ${missing.map((t) => `"${t}"`).join(', ')} this fault expects.`);
      }
      const { answer, next } = answerStep(bench, step, unit, readings);
      path.push({ stepId: step.id, answer });
      stepId = next;
    }
    return row(stepId, false, 'The walk did not reach a finding within as many steps as the tree has.');
  } catch (error) {
    if (error instanceof Stop || error instanceof BenchRefusal) {
      return row(current?.id ?? stepId, false, `Step "${current?.id ?? stepId}": ${error.message}`);
    }
    throw error;
  }
}

/** Every fault of the library that exists on the unit profile, through the graph. */
export function isolationCheck(graph: TreeGraph, options: IsolationOptions & { faults?: readonly Fault[] } = {}): IsolationRow[] {
  const unit: BenchUnit = { ...DEFAULT_BENCH_UNIT, ...options.unit };
  return (options.faults ?? FAULTS).filter((f) => faultFits(f, unit)).map((f) => isolateFault(graph, f.id, { ...options, unit }));
}

/** Every combination of the bench's unit profile. */
export function allBenchUnits(): BenchUnit[] {
  const units: BenchUnit[] = [];
  for (const controlSupply of ['24v', 'line'] as const)
    for (const ignition of ['two-rod', 'single-rod'] as const)
      for (const fuel of ['natural-gas', 'lp'] as const)
        for (const draft of ['induced', 'natural'] as const) units.push({ controlSupply, ignition, fuel, draft });
  return units;
}

function answerStep(bench: Bench, step: Step, unit: BenchUnit, readings: Record<string, number>): { answer: string; next: string } {
  switch (step.kind) {
    case 'fact': {
      const value = unit[step.fact];
      const c = step.cases.find((x) => x.value === value);
      if (!c) throw new Stop(`the unit record's ${step.fact} is "${value}", and the step has no case for it.`);
      return { answer: `${step.fact} = ${value} (unit record)`, next: c.outcome };
    }
    case 'action':
      setEnergy(bench, step.energy);
      return { answer: 'done', next: step.outcome };
    case 'measure':
      return answerMeasure(bench, step, readings);
    case 'inspect':
      return answerInspect(bench, step);
    case 'finding':
      throw new Stop('a finding has no answer.');
  }
}

function answerMeasure(bench: Bench, step: MeasureStep, readings: Record<string, number>): { answer: string; next: string } {
  const probe = step.probe;
  if (!probe) throw new Stop('the step says in words where to measure but has no probe the bench can take.');
  const byGauge = 'gauge' in probe;
  const needsPower = byGauge ? GAUGES[probe.gauge as GaugeId].quantity === 'pressure' : step.quantity !== 'ohm';
  setEnergy(bench, { electric: step.energy.electric === 'any' ? (needsPower ? 'on' : 'off') : step.energy.electric, gas: step.energy.gas });
  if (byGauge && needsPower && gasOf(bench) === 'off') throw new Stop('it reads a gas pressure with the gas left off.');
  for (let attempt = 0; attempt <= RETAKES; attempt++) {
    waitFor(bench, step.at ?? 'now');
    let value: number | null;
    if ('gauge' in probe) value = bench.gauge(probe.gauge as GaugeId).value;
    else value = bench.measure(request(step, probe)).value;
    const reading = value === null ? Number.POSITIVE_INFINITY : value;
    const match = findBand(shiftedBands(step, readings), reading);
    if (!match) throw new Stop(`the reading ${shown(value)} falls in none of its bands.`);
    if (match.band.outcome !== undefined) {
      readings[step.id] = reading;
      return { answer: `${shown(value)} ${step.quantity} → ${match.band.label}`, next: match.band.outcome };
    }
    if (attempt === RETAKES) throw new Stop(`the reading ${shown(value)} asks again ("${match.band.label}") every time it is taken.`);
  }
  throw new Stop('unreachable');
}

function request(step: MeasureStep, probe: Exclude<MeasureStep['probe'], undefined>): MeasureRequest {
  if ('series' in probe) return { mode: 'udc', series: probe.series };
  if ('lead' in probe) return { mode: 'ohm', lead: probe.lead };
  if ('gauge' in probe) throw new Stop('a gauge is not a meter reading.');
  if (step.quantity !== 'vac' && step.quantity !== 'vdc' && step.quantity !== 'ohm')
    throw new Stop(`the meter's leads on two points cannot read ${step.quantity}.`);
  return { mode: step.quantity, a: probe.a, b: probe.b };
}

function answerInspect(bench: Bench, step: InspectStep): { answer: string; next: string } {
  if (!step.observe) throw new Stop('the bench cannot answer a look that says no observation (observe).');
  const looks: Observation[] = [step.observe, ...(step.observeMore ?? [])];
  const seen: string[] = [];
  for (const look of looks) {
    const what = look.what as ObservationKind;
    const power = OBSERVATIONS[what].power;
    const electric = step.energy.electric === 'any' ? (power === 'any' ? 'any' : power) : step.energy.electric;
    setEnergy(bench, { electric, gas: step.energy.gas });
    waitFor(bench, look.at ?? 'now');
    const { result } = bench.observe(what);
    seen.push(`${what}: ${result}`);
    const value = look.choices[result];
    if (value === undefined) continue;
    const choice = step.choices.find((c) => c.value === value);
    if (!choice) throw new Stop(`the observation maps "${result}" to "${value}", which is not one of its choices.`);
    return { answer: `${seen.join(', ')} → ${choice.label}`, next: choice.outcome };
  }
  throw new Stop(`no choice for what the bench showed (${seen.join(', ')}).`);
}

/** The technician's gas (manual shut-off and appliance valve), as the steps' needs left it: on as found. */
const GAS = new WeakMap<Bench, 'on' | 'off'>();
const gasOf = (bench: Bench) => GAS.get(bench) ?? 'on';

function setEnergy(bench: Bench, need: { electric: 'on' | 'off' | 'any'; gas: 'on' | 'off' | 'any' }) {
  if (need.electric === 'on') bench.act('power-on');
  else if (need.electric === 'off') bench.act('power-off');
  if (need.gas !== 'any') GAS.set(bench, need.gas);
}

/**
 * Brings the unit to the moment a reading is taken: `now` as it stands; `call` a few seconds into a
 * call for heat; `proving` into a fresh trial's flame-proving window (reset and call again, as the
 * steps say); `after-proving` once the flame is proven or the first trial has ended without it.
 */
function waitFor(bench: Bench, moment: Moment) {
  if (moment === 'now') return;
  if (!bench.snapshot().powered) throw new Stop(`a reading at "${moment}" needs the power on, and the step has it off.`);
  if (moment !== 'call' && gasOf(bench) === 'off') throw new Stop(`a reading at "${moment}" fires the burners, and the gas is left off.`);
  if (moment === 'call') {
    if (!bench.snapshot().calling) {
      bench.act('call-for-heat');
      bench.act('wait', 3);
    }
    return;
  }
  // A fresh trial: end the call, let the control reset, call again.
  if (bench.snapshot().calling) {
    bench.act('end-call');
    bench.act('wait', 2);
  }
  bench.act('call-for-heat');
  // From one timed step of the control to the next (the end of the pre-purge, of the spark lead…),
  // never further than the longest wait.
  let trialSeen = false;
  let waited = 0;
  let state = bench.snapshot().sequenceState;
  for (;;) {
    if (moment === 'proving' && state === 'trial.proving') {
      // Into the window, where a flame that lights has lit.
      bench.act('wait', STEP_S);
      return;
    }
    if (moment === 'after-proving') {
      if (state === 'running') {
        bench.act('wait', STEP_S);
        return;
      }
      if (state.startsWith('trial')) trialSeen = true;
      else if (trialSeen) return;
    }
    const next = bench.nextEventIn();
    if (next === null || waited + next > MAX_MOMENT_WAIT_S) return;
    const step = Math.max(next, 0.001);
    state = bench.act('wait', step).sequenceState;
    waited += step;
  }
}

const shown = (value: number | null) => (value === null ? 'OL' : String(value));
