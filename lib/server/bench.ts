import 'server-only';
import { randomInt } from 'node:crypto';
import type { z } from 'zod';
import {
  appendBenchEvent,
  createBenchSession,
  getBenchSession,
  listBenchEvents,
  type BenchEventRecord,
  type BenchSessionRecord,
} from '@/db/bench';
import { db } from '@/db/knex';
import {
  BenchRefusal,
  createBench,
  FAULTS,
  faultFits,
  GAUGES,
  getFault,
  type Bench,
  type BenchAction,
  type GaugeId,
  type MeasureRequest,
  type ObservationKind,
} from '@/lib/bench';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { CurrentUser } from '@/lib/server/guard';
import type { benchActionSchema, benchMeasureSchema, benchObserveSchema, createBenchSessionSchema } from '@/lib/validations/bench';

// The bench API: a session's state is never stored, it is the replay of its events through
// lib/bench (deterministic with the session's seed). Every request takes the session's row lock,
// replays, does its one thing and stores it as the next event, so parallel requests on one session
// line up one after the other and keep one sequence.

/** Roles that may know which fault a session runs (apprentices practise without being told). */
const SEES_FAULTS = new Set(['trainer', 'lead', 'admin']);

export const seesFaults = (user: CurrentUser) => SEES_FAULTS.has(user.role);

export function listFaultsFor(user: CurrentUser) {
  if (!seesFaults(user)) return FAULTS.map((f) => ({ id: f.id }));
  return FAULTS.map((f) => ({ id: f.id, title: f.title, description: f.description, expectedFindingTags: [...f.expectedFindingTags] }));
}

export async function startBenchSession({ user, input }: { user: CurrentUser; input: z.output<typeof createBenchSessionSchema> }) {
  if (input.faultId !== null) {
    const fault = getFault(input.faultId);
    if (!fault)
      throw new AppError('bad_request', `There is no fault "${input.faultId}" in the bench's library.`, {
        fieldErrors: { faultId: ['Unknown fault.'] },
      });
    if (!faultFits(fault, input.unit))
      throw new AppError('bad_request', `"${fault.title}" needs a ${fault.requires?.draft ?? fault.requires?.ignition} unit.`, {
        fieldErrors: { faultId: ['This fault does not exist on that unit.'] },
      });
  }
  const session = await createBenchSession({
    companyId: user.companyId,
    userId: user.id,
    unit: input.unit,
    faultId: input.faultId,
    seed: input.seed ?? randomInt(0, 2_147_483_647),
  });
  return { id: session.id };
}

export function benchOf(session: Pick<BenchSessionRecord, 'unit' | 'faultId' | 'seed'>): Bench {
  return createBench({ unit: session.unit, faultId: session.faultId, seed: session.seed });
}

/** Replays stored events on a fresh bench. A stored event was taken once, so it replays the same. */
export function replayBench(bench: Bench, events: readonly Pick<BenchEventRecord, 'kind' | 'payload'>[]): Bench {
  for (const e of events) {
    const p = e.payload;
    if (e.kind === 'action') bench.act(p.action as BenchAction, typeof p.seconds === 'number' ? p.seconds : undefined);
    else if (e.kind === 'measure' && p.mode === 'gauge') bench.gauge(p.gauge as GaugeId);
    else if (e.kind === 'measure') bench.measure(p as unknown as MeasureRequest);
    else bench.observe(p.what as ObservationKind);
  }
  return bench;
}

type Step = { kind: BenchEventRecord['kind']; payload: Record<string, unknown>; result: Record<string, unknown>; simTime: number };

async function onSession<T>(
  { scope, id }: { scope: Scope; id: string },
  work: (bench: Bench) => { step: Step | null; answer: T },
): Promise<T> {
  // Sessions belong to their user, whatever the role: another user's session is not found.
  const own: Scope = { ...scope, reach: 'own' };
  return db.transaction(async (trx) => {
    const session = await getBenchSession({ scope: own, id, lock: true }, trx);
    const events = await listBenchEvents({ companyId: scope.companyId, sessionId: session.id }, trx);
    const bench = replayBench(benchOf(session), events);
    let outcome: { step: Step | null; answer: T };
    try {
      outcome = work(bench);
    } catch (error) {
      if (error instanceof BenchRefusal) throw new AppError('bad_request', error.message);
      throw error;
    }
    if (outcome.step) await appendBenchEvent({ sessionId: session.id, seq: events.length, ...outcome.step }, trx);
    return outcome.answer;
  });
}

export async function benchSessionState({ user, scope, id }: { user: CurrentUser; scope: Scope; id: string }) {
  let faultId: string | null = null;
  const state = await onSession({ scope, id }, (bench) => {
    faultId = bench.fault?.id ?? null;
    return { step: null, answer: { id, ...bench.snapshot() } };
  });
  if (!seesFaults(user)) return state;
  const fault = faultId ? getFault(faultId) : undefined;
  return { ...state, fault: fault ? { id: fault.id, title: fault.title, description: fault.description } : null };
}

export function benchAct({ scope, id }: { scope: Scope; id: string }, input: z.output<typeof benchActionSchema>) {
  return onSession({ scope, id }, (bench) => {
    const answer = bench.act(input.action, input.seconds);
    const payload: Record<string, unknown> = { action: input.action };
    if (input.seconds !== undefined) payload.seconds = input.seconds;
    return { step: { kind: 'action', payload, result: { ...answer }, simTime: answer.time }, answer };
  });
}

export function benchMeasure({ scope, id }: { scope: Scope; id: string }, input: z.output<typeof benchMeasureSchema>) {
  return onSession({ scope, id }, (bench) => {
    if (input.mode === 'gauge' && !(input.gauge in GAUGES)) throw new BenchRefusal('invalid', `The bench has no "${input.gauge}" gauge.`);
    const answer = input.mode === 'gauge' ? bench.gauge(input.gauge as GaugeId) : bench.measure(input as MeasureRequest);
    return { step: { kind: 'measure', payload: { ...input }, result: { ...answer }, simTime: answer.time }, answer };
  });
}

export function benchObserve({ scope, id }: { scope: Scope; id: string }, input: z.output<typeof benchObserveSchema>) {
  return onSession({ scope, id }, (bench) => {
    const answer = bench.observe(input.what as ObservationKind);
    return { step: { kind: 'observe', payload: { what: input.what }, result: { ...answer }, simTime: answer.time }, answer };
  });
}
