// The ignition sequence as the bench runs it, on its simulated clock: pre-purge, the trial for
// ignition (spark lead, then the flame-proving window with the valve powered), the inter-purge
// between failed trials, lockout after the profile's trials, and the automatic retry. Each phase is
// timed by stepping the clock in small waits and noting when the bench's sequence state changes;
// the durations are checked against the control profile the bench runs (DEFAULT_CONTROL_PROFILE in
// machines/ignition-sequence-machine.ts) and, where TRADE.md gives a figure, against it.
import { createBench, type Bench } from '@/lib/bench';
import { DEFAULT_CONTROL_PROFILE, type ControlProfile } from '@/machines/ignition-sequence-machine';

const p = DEFAULT_CONTROL_PROFILE;
const STEP_S = 0.25;

interface Phase {
  state: string;
  from: number;
  to: number;
  sparking: boolean;
  valve: boolean;
  trial: number;
}

/** Powers the bench, calls for heat at t = 0 and steps the clock, noting each sequence state with when it began and ended. */
function phasesOf(bench: Bench, seconds: number): Phase[] {
  bench.act('power-on');
  bench.act('call-for-heat');
  const t0 = bench.snapshot().time;
  const phases: Phase[] = [];
  const note = () => {
    const s = bench.status();
    const now = s.time - t0;
    const last = phases.at(-1);
    if (last && last.state === s.sequenceState) {
      last.to = now;
      last.sparking ||= s.sparking;
      last.valve ||= s.valvePowered;
      return;
    }
    if (last) last.to = now;
    phases.push({ state: s.sequenceState, from: now, to: now, sparking: s.sparking, valve: s.valvePowered, trial: s.trial });
  };
  note();
  for (let t = 0; t < seconds; t += STEP_S) {
    bench.act('wait', STEP_S);
    note();
  }
  return phases;
}

const length = (ph: Phase) => ph.to - ph.from;
const named = (phases: Phase[], state: string) => phases.filter((ph) => ph.state === state);

describe('the ignition sequence on the bench’s simulated clock', () => {
  // A unit where the flame never proves (no gas at the valve): every trial fails.
  const lockoutAt = (p.prePurgeMs + p.trials * (p.sparkLeadMs + p.trialMs) + (p.trials - 1) * p.interPurgeMs) / 1000;
  const phases = phasesOf(createBench({ faultId: 'no-gas', seed: 3 }), lockoutAt + 10);

  it('runs pre-purge, then each trial as spark lead and proving, inter-purge between them, then lockout', () => {
    const order = phases.map((ph) => ph.state);
    const trial = ['trial.spark-lead', 'trial.proving'];
    const expected = [
      'pre-purge',
      ...Array.from({ length: p.trials }, (_, i) => (i === 0 ? trial : ['inter-purge', ...trial])).flat(),
      'lockout',
    ];
    expect(order).toEqual(expected);
  });

  it('takes the profile’s pre-purge before the first spark, with the valve shut', () => {
    const [purge] = named(phases, 'pre-purge');
    expect(purge.from).toBe(0);
    // Within one clock step of the profile's value.
    expect(length(purge)).toBeCloseTo(p.prePurgeMs / 1000, 0);
    expect(Math.abs(length(purge) - p.prePurgeMs / 1000)).toBeLessThanOrEqual(STEP_S);
    expect(purge.valve).toBe(false);
    expect(purge.sparking).toBe(false);
  });

  it('sparks before the valve opens, then holds valve and spark for the proving window', () => {
    for (const lead of named(phases, 'trial.spark-lead')) {
      expect(Math.abs(length(lead) - p.sparkLeadMs / 1000)).toBeLessThanOrEqual(STEP_S);
      expect(lead.sparking).toBe(true);
      expect(lead.valve).toBe(false);
    }
    for (const proving of named(phases, 'trial.proving')) {
      expect(Math.abs(length(proving) - p.trialMs / 1000)).toBeLessThanOrEqual(STEP_S);
      expect(proving.sparking).toBe(true);
      expect(proving.valve).toBe(true);
    }
  });

  it('matches TRADE.md’s figures: a spark lead of a few seconds and a proving window of about 5 s', () => {
    // TRADE.md, "How a DSI control sequences": "the control sparks for a few seconds" (common practice, no source).
    const lead = length(named(phases, 'trial.spark-lead')[0]);
    expect(lead).toBeGreaterThanOrEqual(1);
    expect(lead).toBeLessThanOrEqual(5);
    // TRADE.md, same section: "must then prove flame within a few seconds (about 5 s is common)".
    expect(length(named(phases, 'trial.proving')[0])).toBeCloseTo(5, 0);
  });

  it('purges between failed trials for the profile’s inter-purge, counts the trials, and locks out after the last', () => {
    const purges = named(phases, 'inter-purge');
    expect(purges).toHaveLength(p.trials - 1);
    for (const purge of purges) {
      expect(Math.abs(length(purge) - p.interPurgeMs / 1000)).toBeLessThanOrEqual(STEP_S);
      expect(purge.valve).toBe(false);
    }
    expect(named(phases, 'trial.proving').map((ph) => ph.trial)).toEqual(Array.from({ length: p.trials }, (_, i) => i + 1));
    const [lockout] = named(phases, 'lockout');
    expect(Math.abs(lockout.from - lockoutAt)).toBeLessThanOrEqual(STEP_S);
    expect(lockout.valve).toBe(false);
  });

  it('one long wait fires every timer at its own time: the automatic retry after lockout starts a new pre-purge', () => {
    expect(p.autoResetMs).not.toBeNull();
    const bench = createBench({ faultId: 'no-gas', seed: 3 });
    bench.act('power-on');
    bench.act('call-for-heat');
    // Past lockout and the automatic reset, into the retry's pre-purge, in a single jump.
    bench.act('wait', lockoutAt + p.autoResetMs! / 1000 + p.prePurgeMs / 2000);
    expect(bench.snapshot().sequenceState).toBe('pre-purge');
    // Just before the reset it would still be locked out.
    const early = createBench({ faultId: 'no-gas', seed: 3 });
    early.act('power-on');
    early.act('call-for-heat');
    early.act('wait', lockoutAt + p.autoResetMs! / 1000 - 1);
    expect(early.snapshot().sequenceState).toBe('lockout');
  });

  it('a healthy unit proves flame in its first trial, the flame-proof delay after the valve opens', () => {
    const healthy = phasesOf(createBench({ faultId: null, seed: 3 }), 30);
    expect(healthy.map((ph) => ph.state)).toEqual(['pre-purge', 'trial.spark-lead', 'trial.proving', 'running']);
    const [running] = named(healthy, 'running');
    // The machine's default flame-proof delay is 1 s after the valve opens (IgnitionInput.flameProvesAfterMs).
    expect(Math.abs(running.from - (p.prePurgeMs + p.sparkLeadMs + 1000) / 1000)).toBeLessThanOrEqual(STEP_S);
    expect(running.valve).toBe(true);
  });

  it('follows another control profile: one trial and no automatic retry', () => {
    const profile: Partial<ControlProfile> = { prePurgeMs: 5_000, sparkLeadMs: 1_000, trialMs: 4_000, trials: 1, autoResetMs: null };
    const bench = createBench({ faultId: 'no-gas', seed: 3, profile });
    const run = phasesOf(bench, 12);
    expect(run.map((ph) => ph.state)).toEqual(['pre-purge', 'trial.spark-lead', 'trial.proving', 'lockout']);
    expect(Math.abs(named(run, 'lockout')[0].from - 10)).toBeLessThanOrEqual(STEP_S);
    // Locked out for good until the call or the power is removed.
    bench.act('wait', 7200);
    expect(bench.snapshot().sequenceState).toBe('lockout');
    bench.act('end-call');
    bench.act('call-for-heat');
    expect(bench.snapshot().sequenceState).toBe('pre-purge');
  });
});
