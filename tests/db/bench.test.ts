// @vitest-environment node
import { randomUUID } from 'node:crypto';
import {
  appendBenchEvent,
  createBenchSession,
  getBenchSession,
  getBenchSessionInCompany,
  listBenchEvents,
  listBenchSessions,
} from '@/db/bench';
import { db } from '@/db/knex';
import { createUser } from '@/db/users';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';

// db/bench.ts on the test database: bench sessions belong to their user and company, their events
// are kept in order, one seq once (the primary key refuses a second writer), and the session's row
// lock lines writers up. Two companies of this file's own.
const tag = randomUUID().slice(0, 8);
const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;
let companyA: string;
let companyB: string;
let lee: string;
let kim: string;
let outsider: string;

const company = async (name: string) =>
  (
    await db('companies')
      .insert({ name, office_email: `office-${tag}@${name}.test` })
      .returning('id')
  )[0].id as string;
const person = async (companyId: string, local: string) =>
  (await createUser({ companyId, email: `${local}-${tag}@bench-test.test`, name: `${local} ${tag}`, role: 'lead', passwordHash: 'x' })).id;
const scope = (companyId: string, userId: string, reach: Scope['reach']): Scope => ({ companyId, userId, reach });

async function appError(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

beforeAll(async () => {
  companyA = await company(`bench-a-${tag}`);
  companyB = await company(`bench-b-${tag}`);
  lee = await person(companyA, 'lee');
  kim = await person(companyA, 'kim');
  outsider = await person(companyB, 'out');
});

afterAll(async () => {
  await db('companies').whereIn('id', [companyA, companyB]).delete();
});

describe('bench sessions', () => {
  it('stores the unit, fault and seed, and gives them back as they were stored', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: 'blown-fuse', seed: 42 });
    const got = await getBenchSession({ scope: scope(companyA, lee, 'own'), id: s.id });
    expect(got).toMatchObject({ id: s.id, companyId: companyA, userId: lee, unit, faultId: 'blown-fuse', seed: 42 });
    const none = await createBenchSession({
      companyId: companyA,
      userId: lee,
      unit: { ...unit, draft: 'natural' },
      faultId: null,
      seed: 0,
    });
    expect((await getBenchSession({ scope: scope(companyA, lee, 'own'), id: none.id })).faultId).toBeNull();
  });

  it('answers not found for another user’s session with an own reach, another company’s, and an id that is no uuid', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: null, seed: 1 });
    expect((await appError(getBenchSession({ scope: scope(companyA, kim, 'own'), id: s.id }))).code).toBe('not_found');
    expect((await appError(getBenchSession({ scope: scope(companyB, outsider, 'company'), id: s.id }))).code).toBe('not_found');
    expect((await appError(getBenchSession({ scope: scope(companyA, lee, 'own'), id: 'not-a-uuid' }))).code).toBe('not_found');
    // A company reach reaches a colleague's session; the server's own lookup only its company's.
    expect((await getBenchSession({ scope: scope(companyA, kim, 'company'), id: s.id })).id).toBe(s.id);
    expect((await getBenchSessionInCompany({ companyId: companyA, id: s.id })).userId).toBe(lee);
    expect((await appError(getBenchSessionInCompany({ companyId: companyB, id: s.id }))).code).toBe('not_found');
  });

  it('lists a user’s own sessions newest first, the company’s with a company reach, within a limit', async () => {
    const mine = await listBenchSessions({ scope: scope(companyA, kim, 'own') });
    expect(mine.every((s) => s.userId === kim)).toBe(true);
    const k1 = await createBenchSession({ companyId: companyA, userId: kim, unit, faultId: null, seed: 1 });
    const k2 = await createBenchSession({ companyId: companyA, userId: kim, unit, faultId: null, seed: 2 });
    const own = await listBenchSessions({ scope: scope(companyA, kim, 'own') });
    expect(own.map((s) => s.id).slice(0, 2)).toEqual([k2.id, k1.id]);
    const all = await listBenchSessions({ scope: scope(companyA, kim, 'company') });
    expect(new Set(all.map((s) => s.userId))).toEqual(new Set([lee, kim]));
    expect(await listBenchSessions({ scope: scope(companyA, kim, 'company'), limit: 1 })).toHaveLength(1);
    expect(await listBenchSessions({ scope: scope(companyB, outsider, 'company') })).toEqual([]);
  });
});

describe('bench events', () => {
  it('keeps the events in seq order with their payload, result and simulated time', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: 'blown-fuse', seed: 7 });
    // Written out of order: read back by seq.
    await appendBenchEvent({
      sessionId: s.id,
      seq: 1,
      kind: 'measure',
      payload: { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' },
      result: { value: 24.1, unit: 'VAC', time: 0 },
      simTime: 0,
    });
    await appendBenchEvent({
      sessionId: s.id,
      seq: 0,
      kind: 'action',
      payload: { action: 'power-on' },
      result: { time: 0, sequenceState: 'idle' },
      simTime: 0,
    });
    await appendBenchEvent({
      sessionId: s.id,
      seq: 2,
      kind: 'action',
      payload: { action: 'wait', seconds: 2.5 },
      result: { time: 2.5, sequenceState: 'idle' },
      simTime: 2.5,
    });
    const events = await listBenchEvents({ companyId: companyA, sessionId: s.id });
    expect(events.map((e) => [e.seq, e.kind])).toEqual([
      [0, 'action'],
      [1, 'measure'],
      [2, 'action'],
    ]);
    expect(events[1].payload).toEqual({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' });
    expect(events[1].result).toEqual({ value: 24.1, unit: 'VAC', time: 0 });
    expect(events[2].simTime).toBe(2.5);
    // Another company, or no uuid: nothing.
    expect(await listBenchEvents({ companyId: companyB, sessionId: s.id })).toEqual([]);
    expect(await listBenchEvents({ companyId: companyA, sessionId: 'nope' })).toEqual([]);
  });

  it('refuses a seq taken already as a conflict and stores nothing of it', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: null, seed: 7 });
    await appendBenchEvent({ sessionId: s.id, seq: 0, kind: 'action', payload: { action: 'power-on' }, result: {}, simTime: 0 });
    const error = await appError(
      appendBenchEvent({ sessionId: s.id, seq: 0, kind: 'action', payload: { action: 'power-off' }, result: {}, simTime: 0 }),
    );
    expect(error.code).toBe('conflict');
    const events = await listBenchEvents({ companyId: companyA, sessionId: s.id });
    expect(events).toHaveLength(1);
    expect(events[0].payload).toEqual({ action: 'power-on' });
  });

  it('the session’s row lock makes a second writer wait until the first commits', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: null, seed: 7 });
    const order: string[] = [];
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    let locked!: () => void;
    const firstLocked = new Promise<void>((r) => (locked = r));
    const first = db.transaction(async (trx) => {
      await getBenchSession({ scope: scope(companyA, lee, 'own'), id: s.id, lock: true }, trx);
      locked();
      await held;
      await appendBenchEvent({ sessionId: s.id, seq: 0, kind: 'action', payload: { action: 'power-on' }, result: {}, simTime: 0 }, trx);
      order.push('first');
    });
    await firstLocked;
    const second = db.transaction(async (trx) => {
      await getBenchSession({ scope: scope(companyA, lee, 'own'), id: s.id, lock: true }, trx);
      // By the time the lock is granted the first writer's event is committed: the next seq follows it.
      const seen = await listBenchEvents({ companyId: companyA, sessionId: s.id }, trx);
      order.push(`second saw ${seen.length}`);
      await appendBenchEvent(
        { sessionId: s.id, seq: seen.length, kind: 'action', payload: { action: 'call-for-heat' }, result: {}, simTime: 0 },
        trx,
      );
    });
    await new Promise((r) => setTimeout(r, 150));
    expect(order).toEqual([]);
    release();
    await Promise.all([first, second]);
    expect(order).toEqual(['first', 'second saw 1']);
    expect((await listBenchEvents({ companyId: companyA, sessionId: s.id })).map((e) => e.payload.action)).toEqual([
      'power-on',
      'call-for-heat',
    ]);
  });

  it('deleting a session deletes its events', async () => {
    const s = await createBenchSession({ companyId: companyA, userId: lee, unit, faultId: null, seed: 7 });
    await appendBenchEvent({ sessionId: s.id, seq: 0, kind: 'action', payload: { action: 'power-on' }, result: {}, simTime: 0 });
    await db('bench_sessions').where({ id: s.id }).delete();
    expect(await db('bench_events').where({ session_id: s.id }).count('* as n').first()).toMatchObject({ n: '0' });
  });
});
