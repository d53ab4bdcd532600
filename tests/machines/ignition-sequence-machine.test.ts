import { createActor, SimulatedClock } from 'xstate';
import {
  createIgnitionSequenceMachine,
  DEFAULT_CONTROL_PROFILE,
  describeSequence,
  ignitionSequenceMachine,
  type ControlProfile,
  type IgnitionInput,
} from '@/machines/ignition-sequence-machine';

// Round numbers so the expected times are easy to read; the defaults are common practice, no source.
const profile: ControlProfile = {
  prePurgeMs: 10_000,
  sparkLeadMs: 2_000,
  trialMs: 5_000,
  interPurgeMs: 20_000,
  trials: 3,
  autoResetMs: 3_600_000,
  linePowered: false,
};

const TICK_MS = 250;

function run(input: IgnitionInput, p: ControlProfile = profile) {
  const clock = new SimulatedClock();
  const actor = createActor(createIgnitionSequenceMachine(p), { clock, input });
  actor.start();
  const at = () => actor.getSnapshot();
  // SimulatedClock fires what is due at the new time, and a timer set while firing starts from that
  // new time: one big jump would start the next phase late. So time advances in ticks; every
  // duration here is a multiple of the tick, so each phase starts exactly on time.
  const advanceTo = (ms: number) => {
    while (clock.now() < ms) clock.increment(Math.min(TICK_MS, ms - clock.now()));
  };
  return { actor, clock, at, advanceTo };
}

describe('ignition sequence machine', () => {
  it('uses a flame-proving window of about 5 s by default', () => {
    // Common practice, no source (TRADE.md): about 5 s to prove flame is common.
    expect(DEFAULT_CONTROL_PROFILE.trialMs).toBe(5_000);
    expect(ignitionSequenceMachine.id).toBe('ignition');
  });

  it('runs the happy path to running with the valve powered and the spark off', () => {
    const { actor, at, advanceTo } = run({ flameProves: true, flameProvesAfterMs: 1_500 });
    expect(at().value).toBe('idle');
    actor.send({ type: 'call.start' });
    expect(at().value).toBe('pre-purge');
    expect(at().hasTag('spark')).toBe(false);
    advanceTo(9_999);
    expect(at().value).toBe('pre-purge');
    advanceTo(10_000);
    expect(at().value).toEqual({ trial: 'spark-lead' });
    expect(at().hasTag('spark')).toBe(true);
    expect(at().hasTag('valve-powered')).toBe(false);
    advanceTo(12_000);
    expect(at().value).toEqual({ trial: 'proving' });
    expect(at().hasTag('valve-powered')).toBe(true);
    expect(at().hasTag('spark')).toBe(true);
    advanceTo(13_500);
    expect(at().value).toBe('running');
    expect(at().hasTag('valve-powered')).toBe(true);
    expect(at().hasTag('spark')).toBe(false);
    expect(at().hasTag('rod-powered')).toBe(true);
    // Running lasts while the call is on.
    advanceTo(500_000);
    expect(at().value).toBe('running');
    actor.send({ type: 'call.end' });
    expect(at().value).toBe('idle');
  });

  it('proves flame on a flame.proven event', () => {
    const { actor, at, advanceTo } = run({ flameProves: false });
    actor.send({ type: 'call.start' });
    advanceTo(13_000);
    expect(at().value).toEqual({ trial: 'proving' });
    actor.send({ type: 'flame.proven' });
    expect(at().value).toBe('running');
  });

  it('retries and locks out after the set number of trials, at the right times', () => {
    const { actor, at, advanceTo } = run({ flameProves: false });
    actor.send({ type: 'call.start' });
    // Trial 1: spark 10–12 s, valve 12–17 s; purge 17–37 s.
    advanceTo(16_999);
    expect(at().value).toEqual({ trial: 'proving' });
    advanceTo(17_000);
    expect(at().value).toBe('inter-purge');
    expect(at().hasTag('valve-powered')).toBe(false);
    expect(at().context.trial).toBe(2);
    // Trial 2: 37–44 s; purge 44–64 s. Trial 3: 64–71 s, then lockout.
    advanceTo(37_000);
    expect(at().value).toEqual({ trial: 'spark-lead' });
    advanceTo(44_000);
    expect(at().value).toBe('inter-purge');
    advanceTo(64_000);
    expect(at().value).toEqual({ trial: 'spark-lead' });
    expect(at().context.trial).toBe(3);
    advanceTo(70_999);
    expect(at().value).toEqual({ trial: 'proving' });
    advanceTo(71_000);
    expect(at().value).toBe('lockout');
    expect(at().hasTag('spark')).toBe(false);
    expect(at().hasTag('valve-powered')).toBe(false);
    // It stays locked out without a reset until the automatic retry.
    advanceTo(71_000 + 3_599_999);
    expect(at().value).toBe('lockout');
    advanceTo(71_000 + 3_600_000);
    expect(at().value).toBe('pre-purge');
    expect(at().context.trial).toBe(1);
  });

  it('resets from lockout by removing the call or the power', () => {
    const first = run({ flameProves: false });
    first.actor.send({ type: 'call.start' });
    first.advanceTo(71_000);
    expect(first.at().value).toBe('lockout');
    first.actor.send({ type: 'call.end' });
    expect(first.at().value).toBe('idle');
    first.actor.send({ type: 'call.start' });
    expect(first.at().value).toBe('pre-purge');
    expect(first.at().context.trial).toBe(1);

    const second = run({ flameProves: false });
    second.actor.send({ type: 'call.start' });
    second.advanceTo(71_000);
    second.actor.send({ type: 'power.cycle' });
    // The call is still on, so the control starts over.
    expect(second.at().value).toBe('pre-purge');
  });

  it('stays in lockout without an automatic reset', () => {
    const { actor, at, advanceTo } = run({ flameProves: false }, { ...profile, autoResetMs: null });
    actor.send({ type: 'call.start' });
    advanceTo(71_000);
    expect(at().value).toBe('lockout');
    advanceTo(10 * 3_600_000);
    expect(at().value).toBe('lockout');
  });

  it('never sparks with the safety circuit open', () => {
    const { actor, at, advanceTo } = run({ safetyClosed: false, flameProves: true });
    actor.send({ type: 'call.start' });
    expect(at().value).toBe('safety-open');
    for (let t = 1_000; t <= 600_000; t += 1_000) {
      advanceTo(t);
      expect(at().hasTag('spark')).toBe(false);
      expect(at().hasTag('valve-powered')).toBe(false);
    }
    actor.send({ type: 'safety.close' });
    expect(at().value).toBe('pre-purge');
  });

  it('stops the trial when a safety switch opens', () => {
    const { actor, at, advanceTo } = run({ flameProves: true, flameProvesAfterMs: 1_000 });
    actor.send({ type: 'call.start' });
    advanceTo(20_000);
    expect(at().value).toBe('running');
    actor.send({ type: 'safety.open' });
    expect(at().value).toBe('safety-open');
    expect(at().hasTag('valve-powered')).toBe(false);
  });

  it('keeps rod voltage in every state of a line-powered control, and only in the trial and run otherwise', () => {
    const line = run({ flameProves: false }, { ...profile, linePowered: true });
    expect(line.at().hasTag('rod-powered')).toBe(true);
    line.actor.send({ type: 'call.start' });
    line.advanceTo(71_000);
    expect(line.at().value).toBe('lockout');
    expect(line.at().hasTag('rod-powered')).toBe(true);
    const low = run({ flameProves: false });
    expect(low.at().hasTag('rod-powered')).toBe(false);
  });
});

describe('describeSequence', () => {
  it('lays out the failing sequence to lockout', () => {
    const timeline = describeSequence(profile);
    expect(timeline.map((e) => [e.phase, e.trial, e.startsAtMs, e.endsAtMs])).toEqual([
      ['pre-purge', undefined, 0, 10_000],
      ['spark-lead', 1, 10_000, 12_000],
      ['proving', 1, 12_000, 17_000],
      ['inter-purge', 1, 17_000, 37_000],
      ['spark-lead', 2, 37_000, 39_000],
      ['proving', 2, 39_000, 44_000],
      ['inter-purge', 2, 44_000, 64_000],
      ['spark-lead', 3, 64_000, 66_000],
      ['proving', 3, 66_000, 71_000],
      ['lockout', undefined, 71_000, 71_000 + 3_600_000],
    ]);
    expect(timeline.filter((e) => e.valvePowered).every((e) => e.phase === 'proving' && e.spark)).toBe(true);
    expect(timeline.find((e) => e.phase === 'proving')!.text).toMatch(/valve is powered only during/);
  });

  it('agrees with the machine at every phase boundary', () => {
    for (const flameProves of [false, true]) {
      const timeline = describeSequence(profile, { flameProves, flameProvesAfterMs: 1_500 });
      const { actor, at, advanceTo } = run({ flameProves, flameProvesAfterMs: 1_500 });
      actor.send({ type: 'call.start' });
      for (const entry of timeline) {
        advanceTo(entry.startsAtMs);
        const value = at().value;
        const state = typeof value === 'string' ? value : Object.values(value)[0];
        expect(state, `${entry.phase} at ${entry.startsAtMs}`).toBe(entry.phase);
        expect(at().hasTag('spark')).toBe(entry.spark);
        expect(at().hasTag('valve-powered')).toBe(entry.valvePowered);
        expect(at().hasTag('rod-powered')).toBe(entry.rodPowered);
      }
    }
  });

  it('ends with running when the flame proves', () => {
    const timeline = describeSequence(DEFAULT_CONTROL_PROFILE, { flameProves: true });
    expect(timeline.at(-1)).toMatchObject({ phase: 'running', endsAtMs: null, spark: false, valvePowered: true });
  });
});
