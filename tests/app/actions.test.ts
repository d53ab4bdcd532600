// @vitest-environment node
// The server actions, called as the pages call them (the exported functions of the route groups'
// actions.ts), against the real PostgreSQL: refusals come from the same policy as the routes, a
// request from another site is refused, and hostile input (fast-check, 200 bodies an action) always
// gets an answer with a message — never a throw — and a refusal changes nothing.
import fc from 'fast-check';
import { db } from '@/db/knex';
import type { CurrentUser } from '@/lib/server/guard';
import { reachOf, type OperationName } from '@/lib/policy';
import type { ActionResult } from '@/lib/validations/api';

const state: { user: CurrentUser | null; headers: Headers } = { user: null, headers: new Headers() };

vi.mock('@/lib/server/guard', async () => {
  const { AppError } = await import('@/lib/errors');
  return {
    requireUser: async () => {
      if (!state.user) throw new AppError('unauthorized', 'Sign in to continue.');
      return state.user;
    },
  };
});
vi.mock('next/headers', () => ({ headers: async () => state.headers, cookies: async () => ({ get: () => undefined, set: () => {} }) }));
vi.mock('next/cache', () => ({ revalidatePath: () => {} }));

const admin = await import('@/app/(app)/admin/actions');
const calls = await import('@/app/(app)/calls/actions');
const diagnoses = await import('@/app/(app)/calls/[id]/diagnoses/actions');

/** What the tests read of an ActionResult, whichever way it went. */
type Outcome = { ok: boolean; code?: string; message?: string };

const ACTIONS: [string, (raw: unknown) => Promise<ActionResult<unknown> & Outcome>, OperationName][] = [
  ['createUserAction', admin.createUserAction, 'users.create'],
  ['updateUserAction', admin.updateUserAction, 'users.update'],
  ['updateCompanyAction', admin.updateCompanyAction, 'company.update'],
  ['createSiteAction', calls.createSiteAction, 'sites.create'],
  ['createUnitAction', calls.createUnitAction, 'units.create'],
  ['createCallAction', calls.createCallAction, 'calls.create'],
  ['startDiagnosisAction', calls.startDiagnosisAction, 'diagnoses.start'],
  ['signOffAction', calls.signOffAction, 'diagnoses.signOff'],
  ['closeCallAction', calls.closeCallAction, 'calls.close'],
  ['reopenCallAction', calls.reopenCallAction, 'calls.reopen'],
  ['assignCallAction', calls.assignCallAction, 'calls.assign'],
  ['submitAnswerAction', diagnoses.submitAnswerAction, 'diagnoses.answer'],
  ['undoAnswerAction', diagnoses.undoAnswerAction, 'diagnoses.undo'],
  ['escalateAction', diagnoses.escalateAction, 'diagnoses.escalate'],
];

const TABLES = ['companies', 'users', 'sites', 'units', 'service_calls', 'diagnoses', 'answers', 'call_events'];
async function checksum(): Promise<string> {
  const parts = [];
  for (const t of TABLES) {
    const row = await db(t).first(db.raw('count(*)::int as n'), db.raw(`md5(coalesce(string_agg(${t}::text, '|' order by id), '')) as h`));
    parts.push(`${t}:${row.n}:${row.h}`);
  }
  return parts.join(' ');
}

async function demoUser(email: string): Promise<CurrentUser> {
  const row = await db('users as u')
    .join('companies as c', 'c.id', 'u.company_id')
    .where('u.email', email)
    .first('u.*', 'c.name as company_name');
  return {
    id: row.id,
    companyId: row.company_id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: row.active,
    createdAt: row.created_at,
    companyName: row.company_name,
  } as CurrentUser;
}

beforeAll(() => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
});

afterAll(async () => {
  await db.destroy();
});

beforeEach(() => {
  state.headers = new Headers({ host: '127.0.0.1:3000' });
});

describe('server actions', () => {
  it('answers every action without a session with code unauthorized, and changes nothing', async () => {
    state.user = null;
    const before = await checksum();
    for (const [name, act] of ACTIONS) expect((await act({})).code, name).toBe('unauthorized');
    expect(await checksum()).toBe(before);
  });

  it('refuses each role the policy does not list with code forbidden, exactly where the routes do', async () => {
    for (const email of ['apprentice@demo.test', 'technician@demo.test', 'lead@demo.test', 'trainer@demo.test', 'admin@demo.test']) {
      state.user = await demoUser(email);
      for (const [name, act, op] of ACTIONS) {
        const result = await act({});
        const refused = reachOf(op, state.user.role) === null;
        expect(result.code === 'forbidden', `${email} ${name}: ${result.message}`).toBe(refused);
      }
    }
  });

  it('refuses a request from another site before anything else', async () => {
    state.user = await demoUser('admin@demo.test');
    for (const headers of [{ 'sec-fetch-site': 'cross-site' }, { origin: 'http://elsewhere.test' }] as Record<string, string>[]) {
      state.headers = new Headers({ host: '127.0.0.1:3000', ...headers });
      for (const [name, act] of ACTIONS) {
        const result = await act({ name: 'x' });
        expect(result, name).toMatchObject({ ok: false, code: 'forbidden' });
        expect(result.message).toMatch(/another site/);
      }
    }
  });

  it('answers 200 hostile inputs an action with a message, never a throw, and a refusal changes nothing', async () => {
    const nasty = fc.oneof(
      fc.jsonValue(),
      fc.string({ unit: 'binary', maxLength: 30 }),
      fc.constantFrom('\u0000', '0x28', 'x'.repeat(5000), null, true, [], {}),
    );
    const input = fc.oneof(
      fc.jsonValue(),
      fc.dictionary(
        fc.constantFrom(
          'id',
          'callId',
          'diagnosisId',
          'name',
          'email',
          'unitId',
          'siteId',
          'patch',
          'answer',
          'outcome',
          'repairNotes',
          'cycles',
          'reason',
          'technicianId',
        ),
        nasty,
      ),
    );
    for (const [name, act, op] of ACTIONS) {
      state.user = await demoUser(reachOf(op, 'admin') ? 'admin@demo.test' : 'technician@demo.test');
      let before = await checksum();
      await fc.assert(
        fc.asyncProperty(input, async (raw) => {
          const result = await act(raw);
          if (result.ok) {
            before = await checksum();
            return true;
          }
          expect(typeof result.message === 'string' && result.message.length > 0, `${name}: ${JSON.stringify(raw)}`).toBe(true);
          expect(result.code).not.toBe('internal');
          expect(await checksum(), `${name} changed the tables for ${JSON.stringify(raw).slice(0, 120)}`).toBe(before);
          return true;
        }),
        { numRuns: 200 },
      );
    }
  }, 240_000);
});
