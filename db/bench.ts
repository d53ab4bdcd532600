import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { AppError, notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';

export interface BenchUnitRecord {
  controlSupply: '24v' | 'line';
  ignition: 'two-rod' | 'single-rod';
  fuel: 'natural-gas' | 'lp';
  draft: 'induced' | 'natural';
}

export interface BenchSessionRecord {
  id: string;
  companyId: string;
  userId: string;
  unit: BenchUnitRecord;
  faultId: string | null;
  seed: number;
  createdAt: Date;
}

export type BenchEventKind = 'action' | 'measure' | 'observe';

export interface BenchEventRecord {
  sessionId: string;
  seq: number;
  kind: BenchEventKind;
  /** What was asked: `{ action, seconds? }`, `{ mode, a, b }` / `{ mode, series }` / …, `{ what }`. */
  payload: Record<string, unknown>;
  /** What the bench answered: `{ time, sequenceState }`, `{ value, unit, time }`, `{ result, time }`. */
  result: Record<string, unknown>;
  /** The simulated clock after the event, in seconds. */
  simTime: number;
  createdAt: Date;
}

const toSession = (r: Record<string, unknown>): BenchSessionRecord => ({
  id: r.id as string,
  companyId: r.company_id as string,
  userId: r.user_id as string,
  unit: r.unit as BenchUnitRecord,
  faultId: (r.fault_id as string | null) ?? null,
  seed: r.seed as number,
  createdAt: r.created_at as Date,
});

const toEvent = (r: Record<string, unknown>): BenchEventRecord => ({
  sessionId: r.session_id as string,
  seq: r.seq as number,
  kind: r.kind as BenchEventKind,
  payload: r.payload as Record<string, unknown>,
  result: r.result as Record<string, unknown>,
  simTime: Number(r.sim_time),
  createdAt: r.created_at as Date,
});

export async function createBenchSession(
  {
    companyId,
    userId,
    unit,
    faultId,
    seed,
  }: { companyId: string; userId: string; unit: BenchUnitRecord; faultId: string | null; seed: number },
  trx: Knex = db,
): Promise<BenchSessionRecord> {
  const [row] = await trx('bench_sessions')
    .insert({ company_id: companyId, user_id: userId, unit: JSON.stringify(unit), fault_id: faultId, seed })
    .returning('*');
  return toSession(row);
}

/**
 * One session within reach: with an `own` reach only the user's own (another user's is not found),
 * otherwise any of the company's. `lock` takes the session's row lock, which every append holds so
 * that parallel requests on one session replay and write one after the other.
 */
export async function getBenchSession(
  { scope, id, lock = false }: { scope: Scope; id: string; lock?: boolean },
  trx: Knex = db,
): Promise<BenchSessionRecord> {
  if (!isUuid(id)) throw notFound('That bench session');
  const q = trx('bench_sessions').where({ id, company_id: scope.companyId }).first();
  if (scope.reach === 'own') q.andWhere('user_id', scope.userId);
  if (lock) q.forUpdate();
  const row = await q;
  if (!row) throw notFound('That bench session');
  return toSession(row);
}

/** A session by id within a company, for the server's own use (an attempt reading the session it runs on). */
export async function getBenchSessionInCompany(
  { companyId, id }: { companyId: string; id: string },
  trx: Knex = db,
): Promise<BenchSessionRecord> {
  if (!isUuid(id)) throw notFound('That bench session');
  const row = await trx('bench_sessions').where({ id, company_id: companyId }).first();
  if (!row) throw notFound('That bench session');
  return toSession(row);
}

/** Every event of a session, in order. The caller has checked the session is within reach. */
export async function listBenchEvents(
  { companyId, sessionId }: { companyId: string; sessionId: string },
  trx: Knex = db,
): Promise<BenchEventRecord[]> {
  if (!isUuid(sessionId)) return [];
  const rows = await trx('bench_events as e')
    .join('bench_sessions as s', 's.id', 'e.session_id')
    .where({ 'e.session_id': sessionId, 's.company_id': companyId })
    .orderBy('e.seq')
    .select('e.*');
  return rows.map(toEvent);
}

/**
 * Appends an event as the session's `seq`-th. Call it holding the session's row lock
 * (`getBenchSession({ lock: true })`) with the seq that follows the events replayed; the primary
 * key refuses a seq taken meanwhile, answered as a conflict to try again.
 */
export async function appendBenchEvent(
  { sessionId, seq, kind, payload, result, simTime }: Omit<BenchEventRecord, 'createdAt'>,
  trx: Knex = db,
): Promise<BenchEventRecord> {
  try {
    const [row] = await trx('bench_events')
      .insert({ session_id: sessionId, seq, kind, payload: JSON.stringify(payload), result: JSON.stringify(result), sim_time: simTime })
      .returning('*');
    return toEvent(row);
  } catch (error) {
    if ((error as { code?: string }).code === '23505') throw new AppError('conflict', 'The bench moved on meanwhile. Try again.');
    throw error;
  }
}

/** A user's sessions, newest first. */
export async function listBenchSessions(
  { scope, limit = 50 }: { scope: Scope; limit?: number },
  trx: Knex = db,
): Promise<BenchSessionRecord[]> {
  const q = trx('bench_sessions').where('company_id', scope.companyId).orderBy('created_at', 'desc').limit(limit);
  if (scope.reach === 'own') q.andWhere('user_id', scope.userId);
  return (await q).map(toSession);
}
