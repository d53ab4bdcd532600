// The DSI control's own sequence, as a timed machine: the wizard and the bench use it to say what
// the control is doing at a given moment (is the valve powered now? is it sparking?), and why it
// sits in lockout. How a DSI control sequences is common practice, no source (TRADE.md): the
// timings vary by control, so they are parameters of a control profile.
//
// "lockout" here is the control's own lockout after failed trials, not the energy lockout of the
// lockout/tagout procedure.
import { assign, setup } from 'xstate';

export interface ControlProfile {
  /** Delay from the call (safety circuit closed) to the first trial. */
  prePurgeMs: number;
  /** Spark alone before the valve opens. */
  sparkLeadMs: number;
  /** Flame-proving window: valve open and sparking; flame must be proven within it. */
  trialMs: number;
  /** Valve closed between failed trials. */
  interPurgeMs: number;
  /** Trials before the control locks out. */
  trials: number;
  /** Automatic retry after lockout; null for a control that waits for a manual reset. */
  autoResetMs: number | null;
  /** A line-powered control keeps voltage on the flame rod whenever it is powered (TRADE.md). */
  linePowered: boolean;
}

// Common practice, no source (TRADE.md: timings vary by control). A flame-proving window of about
// 5 s is common; the others are typical orders of magnitude, for a lead to adjust per control.
export const DEFAULT_CONTROL_PROFILE: ControlProfile = {
  prePurgeMs: 15_000,
  sparkLeadMs: 2_000,
  trialMs: 5_000,
  interPurgeMs: 30_000,
  trials: 3,
  autoResetMs: 60 * 60 * 1000,
  linePowered: false,
};

export interface IgnitionInput {
  /** Whether the high limit and rollout switches are closed when the call starts. */
  safetyClosed?: boolean;
  /** Whether a flame lights and is proven during each trial (the bench's injected fault decides). */
  flameProves?: boolean;
  /** When, after the valve opens, the flame is proven if it proves (default 1 s). */
  flameProvesAfterMs?: number;
}

export interface IgnitionContext {
  profile: ControlProfile;
  safetyClosed: boolean;
  flameProves: boolean;
  flameProvesAfterMs: number;
  callActive: boolean;
  /** The trial under way or last made, 1-based. */
  trial: number;
}

export type IgnitionEvent =
  | { type: 'call.start' }
  | { type: 'call.end' }
  | { type: 'power.cycle' }
  | { type: 'safety.open' }
  | { type: 'safety.close' }
  | { type: 'flame.proven' }
  | { type: 'flame.lost' };

export type IgnitionTag = 'spark' | 'valve-powered' | 'rod-powered' | 'flame' | 'purge' | 'trial' | 'safety-open' | 'lockout' | 'waiting';

export function createIgnitionSequenceMachine(profile: ControlProfile = DEFAULT_CONTROL_PROFILE) {
  // Rod voltage: during the trial and the run, and always on a line-powered control.
  const idleRod: IgnitionTag[] = profile.linePowered ? ['rod-powered'] : [];

  return setup({
    types: {
      context: {} as IgnitionContext,
      events: {} as IgnitionEvent,
      input: {} as IgnitionInput | undefined,
      tags: {} as IgnitionTag,
    },
    delays: {
      prePurge: ({ context }) => context.profile.prePurgeMs,
      sparkLead: ({ context }) => context.profile.sparkLeadMs,
      trialWindow: ({ context }) => context.profile.trialMs,
      flameProof: ({ context }) => context.flameProvesAfterMs,
      interPurge: ({ context }) => context.profile.interPurgeMs,
      // Without an automatic reset the guard below keeps this from doing anything.
      autoReset: ({ context }) => context.profile.autoResetMs ?? 0,
    },
    guards: {
      safetyClosed: ({ context }) => context.safetyClosed,
      callActive: ({ context }) => context.callActive,
      flameProves: ({ context }) => context.flameProves && context.flameProvesAfterMs < context.profile.trialMs,
      trialsLeft: ({ context }) => context.trial < context.profile.trials,
      hasAutoReset: ({ context }) => context.profile.autoResetMs !== null && context.callActive,
    },
    actions: {
      startCall: assign({ callActive: true, trial: 1 }),
      endCall: assign({ callActive: false, trial: 1 }),
      firstTrial: assign({ trial: 1 }),
      nextTrial: assign({ trial: ({ context }) => context.trial + 1 }),
      markSafetyOpen: assign({ safetyClosed: false }),
      markSafetyClosed: assign({ safetyClosed: true }),
    },
  }).createMachine({
    id: 'ignition',
    context: ({ input }) => ({
      profile,
      safetyClosed: input?.safetyClosed ?? true,
      flameProves: input?.flameProves ?? true,
      flameProvesAfterMs: input?.flameProvesAfterMs ?? 1_000,
      callActive: false,
      trial: 1,
    }),
    initial: 'idle',
    on: {
      'call.end': { target: '.idle', actions: 'endCall' },
      // Removing power for a few seconds resets the control; if the call is still on it starts over.
      'power.cycle': { target: '.power-up', actions: 'firstTrial' },
      'safety.open': { actions: 'markSafetyOpen' },
      'safety.close': { actions: 'markSafetyClosed' },
    },
    states: {
      idle: {
        tags: ['waiting', ...idleRod],
        on: { 'call.start': { target: 'safety-check', actions: 'startCall' } },
      },
      'power-up': {
        always: [{ guard: 'callActive', target: 'safety-check' }, { target: 'idle' }],
      },
      'safety-check': {
        always: [{ guard: 'safetyClosed', target: 'pre-purge' }, { target: 'safety-open' }],
      },
      'safety-open': {
        tags: ['safety-open', ...idleRod],
        on: { 'safety.close': { target: 'pre-purge', actions: ['markSafetyClosed', 'firstTrial'] } },
      },
      'pre-purge': {
        tags: ['purge', ...idleRod],
        after: { prePurge: 'trial' },
        on: { 'safety.open': { target: 'safety-open', actions: 'markSafetyOpen' } },
      },
      trial: {
        tags: ['trial', 'rod-powered'],
        initial: 'spark-lead',
        on: { 'safety.open': { target: 'safety-open', actions: 'markSafetyOpen' } },
        states: {
          'spark-lead': {
            tags: ['spark'],
            after: { sparkLead: 'proving' },
          },
          proving: {
            tags: ['spark', 'valve-powered'],
            on: { 'flame.proven': '#ignition.running' },
            after: {
              flameProof: { guard: 'flameProves', target: '#ignition.running' },
              trialWindow: [
                { guard: 'trialsLeft', target: '#ignition.inter-purge', actions: 'nextTrial' },
                { target: '#ignition.lockout' },
              ],
            },
          },
        },
      },
      'inter-purge': {
        tags: ['purge', ...idleRod],
        after: { interPurge: 'trial' },
        on: { 'safety.open': { target: 'safety-open', actions: 'markSafetyOpen' } },
      },
      running: {
        tags: ['valve-powered', 'rod-powered', 'flame'],
        on: {
          // Common practice, no source: a loss of flame while running recycles through a purge
          // and a fresh set of trials (some controls count it toward lockout instead).
          'flame.lost': { target: 'inter-purge', actions: 'firstTrial' },
          'safety.open': { target: 'safety-open', actions: 'markSafetyOpen' },
        },
      },
      lockout: {
        tags: ['lockout', ...idleRod],
        after: { autoReset: { guard: 'hasAutoReset', target: 'safety-check', actions: 'firstTrial' } },
      },
    },
  });
}

export const ignitionSequenceMachine = createIgnitionSequenceMachine();

export type IgnitionPhase = 'pre-purge' | 'spark-lead' | 'proving' | 'inter-purge' | 'running' | 'lockout';

export interface SequenceEntry {
  phase: IgnitionPhase;
  /** 1-based trial number for the spark-lead, proving and inter-purge phases. */
  trial?: number;
  startsAtMs: number;
  /** null: lasts until the call ends (running) or a reset (lockout without automatic retry). */
  endsAtMs: number | null;
  spark: boolean;
  valvePowered: boolean;
  rodPowered: boolean;
  text: string;
}

/**
 * The timeline from the call for heat (safety circuit closed), for the wizard to tell the
 * technician what to expect when. Without `flameProves` it is the sequence of a unit that does not
 * prove flame, ending in lockout — the one a no-heat call usually shows.
 */
export function describeSequence(
  profile: ControlProfile = DEFAULT_CONTROL_PROFILE,
  { flameProves = false, flameProvesAfterMs = 1_000 }: { flameProves?: boolean; flameProvesAfterMs?: number } = {},
): SequenceEntry[] {
  const rodIdle = profile.linePowered;
  const out: SequenceEntry[] = [];
  let t = 0;
  out.push({
    phase: 'pre-purge',
    startsAtMs: t,
    endsAtMs: (t += profile.prePurgeMs),
    spark: false,
    valvePowered: false,
    rodPowered: rodIdle,
    text: `Pre-purge: the control waits ${seconds(profile.prePurgeMs)} before the first trial. No spark, valve closed.`,
  });
  const proves = flameProves && flameProvesAfterMs < profile.trialMs;
  for (let trial = 1; trial <= profile.trials; trial++) {
    out.push({
      phase: 'spark-lead',
      trial,
      startsAtMs: t,
      endsAtMs: (t += profile.sparkLeadMs),
      spark: true,
      valvePowered: false,
      rodPowered: true,
      text: `Trial ${trial}: spark for ${seconds(profile.sparkLeadMs)} before the valve opens. Look and listen for the spark now.`,
    });
    if (proves) {
      out.push({
        phase: 'proving',
        trial,
        startsAtMs: t,
        endsAtMs: t + flameProvesAfterMs,
        spark: true,
        valvePowered: true,
        rodPowered: true,
        text: `Trial ${trial}: valve powered while sparking; the flame is proven after ${seconds(flameProvesAfterMs)}.`,
      });
      out.push({
        phase: 'running',
        startsAtMs: t + flameProvesAfterMs,
        endsAtMs: null,
        spark: false,
        valvePowered: true,
        rodPowered: true,
        text: 'Running: spark off, valve powered and flame signal present until the call ends.',
      });
      return out;
    }
    out.push({
      phase: 'proving',
      trial,
      startsAtMs: t,
      endsAtMs: (t += profile.trialMs),
      spark: true,
      valvePowered: true,
      rodPowered: true,
      text: `Trial ${trial}: the valve is powered only during this ${seconds(profile.trialMs)} flame-proving window, while it sparks. Measure valve voltage and gas pressure within these first seconds.`,
    });
    if (trial < profile.trials) {
      out.push({
        phase: 'inter-purge',
        trial,
        startsAtMs: t,
        endsAtMs: (t += profile.interPurgeMs),
        spark: false,
        valvePowered: false,
        rodPowered: rodIdle,
        text: `No flame proven: the valve closes and the control waits ${seconds(profile.interPurgeMs)} before trial ${trial + 1}.`,
      });
    }
  }
  out.push({
    phase: 'lockout',
    startsAtMs: t,
    endsAtMs: profile.autoResetMs === null ? null : t + profile.autoResetMs,
    spark: false,
    valvePowered: false,
    rodPowered: rodIdle,
    text:
      profile.autoResetMs === null
        ? `Lockout after ${profile.trials} trials: no spark, valve closed. Reset by removing the call or the power for a few seconds.`
        : `Lockout after ${profile.trials} trials: no spark, valve closed. Reset by removing the call or the power for a few seconds; the control also retries by itself after ${seconds(profile.autoResetMs)}.`,
  });
  return out;
}

function seconds(ms: number): string {
  const s = ms / 1000;
  if (s >= 120 && s % 60 === 0) return s % 3600 === 0 ? `${s / 3600} h` : `${s / 60} min`;
  return `${s} s`;
}
