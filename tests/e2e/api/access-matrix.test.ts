// The access matrix, generated from the policy table (lib/policy.ts): every operation, for every
// identity (anonymous, each role of our company, the other company's admin and technician), against
// the caller's own row, someone else's row in the company, and the other company's row, through its
// HTTP route. The expected answer comes from the policy alone: 401 without a session, 403 for a role
// the policy does not list, 404 for a row out of the role's reach; anything else must be the
// operation's own answer (2xx, or a 400/409 of its own), never 401/403/404 and never a 500.
// Bodies are valid where a row is named (so the reach is what decides), and changes they make land
// on rows made for this file. An operation of the policy without a row in ROUTES fails the suite.
// @vitest-environment node
import { randomUUID } from 'node:crypto';
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { OPERATION_NAMES, reachOf, type OperationName } from '@/lib/policy';
import type { Role } from '@/lib/roles';
import { ApiClient, DEMO, signedIn } from '../support/http';

type Variant = 'own' | 'company' | 'other' | 'none';

/** The records one case works on, by the kind of row the operation takes. */
interface Rows {
  callId: string;
  diagnosisId: string;
  unitId: string;
  siteId: string;
  userId: string;
  treeVersionId: string;
  /** The tree of that (published) version. */
  treeId: string;
  /** The unit's draft as stored, so that correcting it to itself changes nothing. */
  unitDraft: string;
  /** The owner of the call: who the row belongs to. */
  ownerRole: Role;
  ownerName: string;
}

interface RouteCase {
  method: string;
  path: (r: Rows) => string;
  body?: (r: Rows) => unknown;
  /** Whether the operation works on a row (three variants) or on none (lists, the company, the user). */
  rows: boolean;
}

const ROUTES: Record<OperationName, RouteCase> = {
  'auth.signIn': { method: 'POST', path: () => '/api/auth/sign-in', body: () => ({ email: 'not an e-mail', password: 'x' }), rows: false },
  'auth.signOut': { method: 'POST', path: () => '/api/auth/sign-out', rows: false },
  'auth.signOutEverywhere': { method: 'POST', path: () => '/api/auth/sign-out-everywhere', rows: false },
  'health.get': { method: 'GET', path: () => '/api/health', rows: false },
  'me.get': { method: 'GET', path: () => '/api/me', rows: false },
  'company.get': { method: 'GET', path: () => '/api/company', rows: false },
  'company.update': {
    method: 'PATCH',
    path: () => '/api/company',
    body: () => ({ name: '', officeEmail: 'x', displayUnits: 'us' }),
    rows: false,
  },
  'users.list': { method: 'GET', path: () => '/api/users', rows: false },
  'users.create': {
    method: 'POST',
    path: () => '/api/users',
    body: () => ({ email: 'bad', name: '', role: 'apprentice', password: 'short' }),
    rows: false,
  },
  // The owner's own name: an update the policy lets through stores what is there, so the demo
  // people keep their names for the tests that greet them.
  'users.update': { method: 'PATCH', path: (r) => `/api/users/${r.userId}`, body: (r) => ({ name: r.ownerName }), rows: true },
  'sites.list': { method: 'GET', path: () => '/api/sites', rows: false },
  'sites.create': { method: 'POST', path: () => '/api/sites', body: () => ({ name: '', address: '' }), rows: false },
  'units.list': { method: 'GET', path: () => '/api/units', rows: false },
  'units.create': {
    method: 'POST',
    path: () => '/api/units',
    body: (r) => ({
      siteId: r.siteId,
      label: 'Matrix furnace',
      ignition: 'two-rod',
      fuel: 'natural-gas',
      controlSupply: '24v',
      transformerVa: 40,
    }),
    rows: true,
  },
  'units.get': { method: 'GET', path: (r) => `/api/units/${r.unitId}`, rows: true },
  // The unit's own draft: a correction the policy lets through stores what is already there.
  'units.correct': { method: 'PATCH', path: (r) => `/api/units/${r.unitId}`, body: (r) => ({ draft: r.unitDraft }), rows: true },
  'calls.list': { method: 'GET', path: () => '/api/calls', rows: false },
  'calls.create': {
    method: 'POST',
    path: () => '/api/calls',
    body: (r) => ({ unitId: r.unitId, complaint: 'No heat (matrix)' }),
    rows: true,
  },
  'calls.get': { method: 'GET', path: (r) => `/api/calls/${r.callId}`, rows: true },
  'calls.recordRepair': {
    method: 'PUT',
    path: (r) => `/api/calls/${r.callId}/repair`,
    body: () => ({ repairNotes: 'Cleaned the flame rod (matrix)', cycles: 3 }),
    rows: true,
  },
  'calls.close': {
    method: 'POST',
    path: (r) => `/api/calls/${r.callId}/close`,
    body: () => ({ outcome: 'referred', reason: 'Needs the office (matrix)' }),
    rows: true,
  },
  // Run after calls.close (policy order), so the call it reopens may well be referred by then.
  'calls.reopen': {
    method: 'POST',
    path: (r) => `/api/calls/${r.callId}/reopen`,
    body: () => ({ reason: 'Reopened by the matrix' }),
    rows: true,
  },
  // To its own owner: a valid body whose answer (409 "already with", or 400 for a non-field owner) is the operation's own.
  'calls.assign': { method: 'POST', path: (r) => `/api/calls/${r.callId}/assign`, body: (r) => ({ technicianId: r.userId }), rows: true },
  'diagnoses.start': {
    method: 'POST',
    path: (r) => `/api/calls/${r.callId}/diagnoses`,
    body: (r) => ({ treeVersionId: r.treeVersionId }),
    rows: true,
  },
  'diagnoses.get': { method: 'GET', path: (r) => `/api/diagnoses/${r.diagnosisId}`, rows: true },
  'diagnoses.answer': {
    method: 'POST',
    path: (r) => `/api/diagnoses/${r.diagnosisId}/answers`,
    body: () => ({ clientId: randomUUID(), stepId: 'no-such-step' }),
    rows: true,
  },
  'diagnoses.undo': { method: 'DELETE', path: (r) => `/api/diagnoses/${r.diagnosisId}/answers/last?last=${randomUUID()}`, rows: true },
  'diagnoses.signOff': { method: 'POST', path: (r) => `/api/diagnoses/${r.diagnosisId}/sign-off`, rows: true },
  // A valid note (a body the schema refuses would answer 400 before the row is looked up): the
  // first one allowed escalates (200), later ones find it ended (409). It runs after the answers.
  'diagnoses.escalate': {
    method: 'POST',
    path: (r) => `/api/diagnoses/${r.diagnosisId}/escalate`,
    body: () => ({ note: 'Escalated by the matrix' }),
    rows: true,
  },
  'diagnoses.escalations': { method: 'GET', path: () => '/api/escalations', rows: false },
  'trees.list': { method: 'GET', path: () => '/api/trees', rows: false },
  'treeVersions.get': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}`, rows: true },
  // Tree authoring (h8s). On the published version every change is the operation's own 409 (not a
  // draft, not submitted, not approved); a new tree and an import are refused by their own 400.
  // Starting a draft does start one (a copy of the published version) on the company's tree.
  'trees.authoring': { method: 'GET', path: () => '/api/trees/authoring', rows: false },
  'trees.get': { method: 'GET', path: (r) => `/api/trees/${r.treeId}`, rows: true },
  'trees.create': { method: 'POST', path: () => '/api/trees', body: () => ({ title: '', symptom: '', equipmentKind: '' }), rows: false },
  'trees.startDraft': {
    method: 'POST',
    path: (r) => `/api/trees/${r.treeId}/drafts`,
    body: (r) => ({ fromVersionId: r.treeVersionId }),
    rows: true,
  },
  'trees.import': { method: 'POST', path: () => '/api/trees/import', body: () => ({ document: { format: 'not ours' } }), rows: false },
  'treeVersions.authoring': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}/authoring`, rows: true },
  'treeVersions.save': {
    method: 'PUT',
    path: (r) => `/api/tree-versions/${r.treeVersionId}`,
    body: () => ({ baseRevision: 1, graph: { start: 'x', steps: [] } }),
    rows: true,
  },
  'treeVersions.submit': { method: 'POST', path: (r) => `/api/tree-versions/${r.treeVersionId}/submit`, rows: true },
  'treeVersions.approve': { method: 'POST', path: (r) => `/api/tree-versions/${r.treeVersionId}/approve`, rows: true },
  'treeVersions.return': {
    method: 'POST',
    path: (r) => `/api/tree-versions/${r.treeVersionId}/return`,
    body: () => ({ comments: [{ text: 'Matrix comment' }] }),
    rows: true,
  },
  'treeVersions.publish': { method: 'POST', path: (r) => `/api/tree-versions/${r.treeVersionId}/publish`, rows: true },
  'treeVersions.validation': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}/validation`, rows: true },
  'treeVersions.diff': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}/diff?against=builtin`, rows: true },
  'treeVersions.export': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}/export`, rows: true },
  'treeVersions.isolationCheck': { method: 'GET', path: (r) => `/api/tree-versions/${r.treeVersionId}/isolation-check`, rows: true },
  'trees.usage': { method: 'GET', path: (r) => `/api/trees/${r.treeId}/usage`, rows: true },
  'trees.companyUsage': { method: 'GET', path: () => '/api/trees/usage', rows: false },
  'reports.pdf': { method: 'GET', path: (r) => `/api/calls/${r.callId}/report.pdf`, rows: true },
  'reports.emailPreview': { method: 'GET', path: (r) => `/api/calls/${r.callId}/report-email`, rows: true },
  'reports.email': {
    method: 'POST',
    path: (r) => `/api/calls/${r.callId}/report-email`,
    body: () => ({ to: ['matrix@demo.test'], subject: 'Matrix report', body: 'Matrix', idempotencyKey: randomUUID() }),
    rows: true,
  },
  // Each matrix call has a sent e-mail whose id is the call's own (made below), so the row decides.
  'mail.resend': {
    method: 'POST',
    path: (r) => `/api/outbox/${r.callId}/resend`,
    body: () => ({ idempotencyKey: randomUUID() }),
    rows: true,
  },
  'mail.mailbox': { method: 'GET', path: () => '/api/dev/mailbox', rows: false },
  // Photos (h10a): each matrix call has photos made below (rows only: the objects are not needed to
  // sign a link or to delete). The upload is sent as JSON: past the call's reach it is refused 415.
  'attachments.upload': { method: 'POST', path: (r) => `/api/calls/${r.callId}/attachments`, body: () => ({ file: 'x' }), rows: true },
  'attachments.list': { method: 'GET', path: (r) => `/api/calls/${r.callId}/attachments`, rows: true },
  'attachments.get': { method: 'GET', path: (r) => `/api/attachments/${photosOf(r)[0]}?size=thumb`, rows: true },
  // A photo of its own for every request: a delete the policy lets through removes it.
  'attachments.delete': { method: 'DELETE', path: (r) => `/api/attachments/${photosOf(r).pop()}`, rows: true },
  'notifications.get': { method: 'GET', path: () => '/api/me/notifications', rows: false },
  'notifications.update': { method: 'PUT', path: () => '/api/me/notifications', body: () => ({}), rows: false },
  // Practice (h9ui): the rows are a scenario, an assignment and an unfinished attempt made below in the
  // company of each matrix call's owner (the apprentice's own when the owner is the apprentice).
  'practice.overview': { method: 'GET', path: () => '/api/practice', rows: false },
  'practice.scenarios.create': { method: 'POST', path: () => '/api/practice/scenarios', body: () => ({ title: '' }), rows: false },
  'practice.scenarios.get': { method: 'GET', path: (r) => `/api/practice/scenarios/${practiceOf(r).scenarioId}`, rows: true },
  // The apprentice already has it: assigning again adds nobody.
  'practice.scenarios.assign': {
    method: 'POST',
    path: (r) => `/api/practice/scenarios/${practiceOf(r).scenarioId}/assignments`,
    body: (r) => ({ apprenticeIds: [practiceOf(r).apprenticeId] }),
    rows: true,
  },
  'practice.assignments.list': { method: 'GET', path: () => '/api/practice/assignments', rows: false },
  // The attempt is open already, so starting resumes it.
  'practice.attempts.start': {
    method: 'POST',
    path: (r) => `/api/practice/assignments/${practiceOf(r).assignmentId}/attempts`,
    rows: true,
  },
  'practice.attempts.get': { method: 'GET', path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}`, rows: true },
  // Not a finding of the tree: the operation's own 400, nothing scored.
  'practice.attempts.finish': {
    method: 'POST',
    path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/finish`,
    body: () => ({ findingStepId: 'no-such-finding' }),
    rows: true,
  },
  // The matrix's attempt walks no tree: the operation's own 400, nothing stored.
  'practice.attempts.answer': {
    method: 'POST',
    path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/answers`,
    body: () => ({ clientId: '00000000-0000-4000-8000-000000000001', stepId: 'start', confirmed: true }),
    rows: true,
  },
  'practice.attempts.undo': { method: 'DELETE', path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/answers/last`, rows: true },
  'practice.progress': { method: 'GET', path: (r) => `/api/practice/apprentices/${practiceOf(r).apprenticeId}`, rows: true },
  'practice.bench.get': { method: 'GET', path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/bench`, rows: true },
  'practice.bench.act': {
    method: 'POST',
    path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/bench/actions`,
    body: () => ({ action: 'wait', seconds: 1 }),
    rows: true,
  },
  'practice.bench.measure': {
    method: 'POST',
    path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/bench/measure`,
    body: () => ({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' }),
    rows: true,
  },
  'practice.bench.observe': {
    method: 'POST',
    path: (r) => `/api/practice/attempts/${practiceOf(r).attemptId}/bench/observe`,
    body: () => ({ what: 'spark' }),
    rows: true,
  },
  'bench.sessions.create': {
    method: 'POST',
    path: () => '/api/bench/sessions',
    body: () => ({ faultId: 'no-such-fault', unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas' } }),
    rows: false,
  },
  'bench.sessions.get': { method: 'GET', path: (r) => `/api/bench/sessions/${benchOf(r)}`, rows: true },
  'bench.sessions.act': {
    method: 'POST',
    path: (r) => `/api/bench/sessions/${benchOf(r)}/actions`,
    body: () => ({ action: 'wait', seconds: 1 }),
    rows: true,
  },
  'bench.sessions.measure': {
    method: 'POST',
    path: (r) => `/api/bench/sessions/${benchOf(r)}/measure`,
    body: () => ({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' }),
    rows: true,
  },
  'bench.sessions.observe': {
    method: 'POST',
    path: (r) => `/api/bench/sessions/${benchOf(r)}/observe`,
    body: () => ({ what: 'spark' }),
    rows: true,
  },
  'bench.faults': { method: 'GET', path: () => '/api/bench/faults', rows: false },
};

/** The matrix photos of each call, by call id ([0] is read, the others are deleted one by one). */
const matrixPhotos = new Map<string, string[]>();
const photosOf = (r: Rows): string[] => matrixPhotos.get(r.callId)!;

interface PracticeRows {
  scenarioId: string;
  assignmentId: string;
  attemptId: string;
  apprenticeId: string;
}
const practiceRows = new Map<string, PracticeRows>();
const practiceOf = (r: Rows): PracticeRows => practiceRows.get(r.userId)!;
/** An apprentice's own practice rows: the others of the company are out of an `own` reach. */
const OWN_PRACTICE =
  /^(practice\.(attempts\.(start|get|finish|answer|undo)|bench\.(get|act|measure|observe))|bench\.sessions\.(get|act|measure|observe))$/;
/** A bench session of each row owner's own (bench.sessions.*: a session belongs to its user whatever the role). */
const benchSessions = new Map<string, string>();
const benchOf = (r: Rows): string => benchSessions.get(r.userId)!;

// The calls and diagnoses a reach covers: the whole company, one's own, or (supervised) one's own and apprentices'.
const CALL_ROWS =
  /^(calls\.(get|recordRepair|close|reopen|assign)|diagnoses\.(start|get|answer|undo|signOff|escalate)|reports\.(pdf|emailPreview|email)|mail\.resend|attachments\.(upload|list|get|delete))$/;

interface Identity {
  label: string;
  email: string | null;
  role: Role | null;
  company: 'ours' | 'theirs';
}

const IDENTITIES: Identity[] = [
  { label: 'anonymous', email: null, role: null, company: 'ours' },
  { label: 'apprentice', email: DEMO.apprentice, role: 'apprentice', company: 'ours' },
  { label: 'technician', email: DEMO.technician, role: 'technician', company: 'ours' },
  { label: 'lead', email: DEMO.lead, role: 'lead', company: 'ours' },
  { label: 'trainer', email: DEMO.trainer, role: 'trainer', company: 'ours' },
  { label: 'admin', email: DEMO.admin, role: 'admin', company: 'ours' },
  { label: 'other company admin', email: DEMO.otherAdmin, role: 'admin', company: 'theirs' },
  { label: 'other company technician', email: DEMO.otherTechnician, role: 'technician', company: 'theirs' },
];

let db: Knex;
const clients = new Map<string, ApiClient>();
const rowsFor = new Map<string, Record<Exclude<Variant, 'none'>, Rows>>();

async function userByEmail(email: string) {
  return db('users').whereRaw('lower(email) = ?', [email]).first('id', 'company_id', 'role', 'name');
}

/** A call assigned to `ownerEmail`, with a diagnosis on it, in the owner's company. */
async function callOf(ownerEmail: string): Promise<Rows> {
  const owner = await userByEmail(ownerEmail);
  const unit = await db('units').where({ company_id: owner.company_id }).first('id', 'site_id', 'draft');
  const version = await db('tree_versions').where({ company_id: owner.company_id, status: 'published' }).first('id', 'tree_id');
  const [call] = await db('service_calls')
    .insert({ company_id: owner.company_id, unit_id: unit.id, complaint: 'No heat (matrix row)', technician_id: owner.id })
    .returning('id');
  const [diagnosis] = await db('diagnoses')
    .insert({ company_id: owner.company_id, call_id: call.id, tree_version_id: version.id, user_id: owner.id })
    .returning('id');
  return {
    callId: call.id,
    diagnosisId: diagnosis.id,
    unitId: unit.id,
    unitDraft: unit.draft,
    siteId: unit.site_id,
    userId: owner.id,
    treeVersionId: version.id,
    treeId: version.tree_id,
    ownerRole: owner.role,
    ownerName: owner.name,
  };
}

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  for (const identity of IDENTITIES) clients.set(identity.label, identity.email ? await signedIn(identity.email) : new ApiClient());
  // Someone else in each company (a lead, not an apprentice, so a supervising technician does not reach it).
  const oursElse = await callOf(DEMO.lead2);
  const theirsElse = await callOf(DEMO.otherAdmin);
  const theirsTech = await callOf(DEMO.otherTechnician);
  for (const identity of IDENTITIES) {
    const own = identity.email ? await callOf(identity.email) : oursElse;
    if (identity.company === 'ours') rowsFor.set(identity.label, { own, company: oursElse, other: theirsTech });
    else rowsFor.set(identity.label, { own, company: identity.email === DEMO.otherAdmin ? theirsTech : theirsElse, other: oursElse });
  }
});

// A sent e-mail on every matrix call, with the call's id, for mail.resend to name.
beforeAll(async () => {
  const calls = new Set([...rowsFor.values()].flatMap((v) => [v.own.callId, v.company.callId, v.other.callId]));
  for (const id of calls) {
    const call = await db('service_calls').where({ id }).first('company_id');
    await db('outbox')
      .insert({
        id,
        company_id: call.company_id,
        call_id: id,
        kind: 'report',
        idempotency_key: `matrix:${id}`,
        recipients: JSON.stringify(['matrix@demo.test']),
        subject: 'Matrix report',
        body: 'Matrix',
        status: 'sent',
      })
      .onConflict('id')
      .ignore();
  }
});

// Photos on every matrix call (h10a): one to read, and enough to delete one per request.
beforeAll(async () => {
  const calls = new Set([...rowsFor.values()].flatMap((v) => [v.own.callId, v.company.callId, v.other.callId]));
  for (const id of calls) {
    const call = await db('service_calls').where({ id }).first('company_id');
    const ids: string[] = [];
    for (let i = 0; i < 1 + IDENTITIES.length * 2; i += 1) {
      const photo = randomUUID();
      const key = `companies/${call.company_id}/calls/${id}/${photo}`;
      await db('attachments').insert({
        id: photo,
        company_id: call.company_id,
        call_id: id,
        key: `${key}/display.webp`,
        thumb_key: `${key}/thumb.webp`,
        content_type: 'image/webp',
        size: 1,
        original_size: 1,
        width: 1,
        height: 1,
      });
      ids.push(photo);
    }
    matrixPhotos.set(id, ids);
  }
});

// A practice scenario, assignment and open attempt in the company of every matrix row's owner.
beforeAll(async () => {
  const owners = new Set([...rowsFor.values()].flatMap((v) => [v.own.userId, v.company.userId, v.other.userId]));
  for (const ownerId of owners) {
    const owner = await db('users').where({ id: ownerId }).first('id', 'company_id', 'role');
    // A row owner who is not an apprentice gets practice rows of an apprentice of their own, never the
    // demo apprentice's: those would be in the apprentice identity's own reach.
    let apprenticeId: string | undefined = owner.role === 'apprentice' ? owner.id : undefined;
    if (!apprenticeId) {
      const [made] = await db('users')
        .insert({
          company_id: owner.company_id,
          email: `matrix-apprentice-${randomUUID()}@other.demo.test`,
          name: 'Matrix apprentice',
          role: 'apprentice',
          password_hash: 'x',
        })
        .returning('id');
      apprenticeId = made.id as string;
    }
    const [scenario] = await db('practice_scenarios')
      .insert({
        company_id: owner.company_id,
        title: 'Matrix scenario',
        fault_ids: ['blown-fuse'],
        unit: JSON.stringify({ controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' }),
      })
      .returning('id');
    const [assignment] = await db('practice_assignments')
      .insert({ company_id: owner.company_id, scenario_id: scenario.id, apprentice_id: apprenticeId })
      .returning('id');
    const [session] = await db('bench_sessions')
      .insert({
        company_id: owner.company_id,
        user_id: apprenticeId,
        unit: JSON.stringify({ controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' }),
        fault_id: 'blown-fuse',
        seed: 1,
      })
      .returning('id');
    const [attempt] = await db('practice_attempts')
      .insert({
        company_id: owner.company_id,
        assignment_id: assignment.id,
        scenario_id: scenario.id,
        apprentice_id: apprenticeId,
        bench_session_id: session.id,
        fault_id: 'blown-fuse',
      })
      .returning('id');
    practiceRows.set(ownerId, { scenarioId: scenario.id, assignmentId: assignment.id, attemptId: attempt.id, apprenticeId: apprenticeId! });
  }
});

beforeAll(async () => {
  const owners = new Set([...rowsFor.values()].flatMap((v) => [v.own.userId, v.company.userId, v.other.userId]));
  for (const userId of owners) {
    const user = await db('users').where({ id: userId }).first('company_id');
    const [session] = await db('bench_sessions')
      .insert({
        company_id: user.company_id,
        user_id: userId,
        unit: JSON.stringify({ controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' }),
        fault_id: null,
        seed: 1,
      })
      .returning('id');
    benchSessions.set(userId, session.id);
  }
});

afterAll(async () => {
  await db.destroy();
});

/** What the policy says the answer must be; `null` when the operation's own answer is expected. */
function expected(name: OperationName, identity: Identity, variant: Variant, rows: Rows | null): 401 | 403 | 404 | null {
  const isPublic = name === 'auth.signIn' || name === 'auth.signOut' || name === 'health.get';
  if (isPublic) return null;
  if (!identity.role) return 401;
  const reach = reachOf(name, identity.role);
  if (!reach) return 403;
  if (variant === 'other') return 404;
  if (variant === 'company' && OWN_PRACTICE.test(name) && reach === 'own') return 404;
  if (variant === 'company' && CALL_ROWS.test(name)) {
    if (reach === 'own') return 404;
    if (reach === 'supervised' && rows?.ownerRole !== 'apprentice') return 404;
  }
  return null;
}

// Signing out ends the identity's session, so those two run after everything else.
const LAST: OperationName[] = ['auth.signOut', 'auth.signOutEverywhere'];
const ORDER = [...OPERATION_NAMES.filter((n) => !LAST.includes(n)), ...LAST];

describe('access matrix from the policy table', () => {
  it('has a route case for every operation of the policy', () => {
    for (const name of OPERATION_NAMES) expect(ROUTES[name], name).toBeDefined();
  });

  for (const name of ORDER) {
    it(`${name}: every identity and row answers as the policy says`, async () => {
      const route = ROUTES[name];
      expect(route, `no route case for ${name}`).toBeDefined();
      const failures: string[] = [];
      for (const identity of IDENTITIES) {
        // Signing out ends the session it is sent with: those two get a session of their own each.
        const client = LAST.includes(name) && identity.email ? await signedIn(identity.email) : clients.get(identity.label)!;
        const variants: Variant[] = route.rows ? ['own', 'company', 'other'] : ['none'];
        for (const variant of variants) {
          const rows = variant === 'none' ? rowsFor.get(identity.label)!.own : rowsFor.get(identity.label)![variant];
          const res = await client.call(route.method, route.path(rows), route.body?.(rows));
          const want = expected(name, identity, variant, rows);
          const where = `${identity.label} × ${variant}: ${res.status} ${res.text.slice(0, 120)}`;
          if (res.status >= 500) failures.push(`${where} (a 500)`);
          else if (want !== null && res.status !== want) failures.push(`${where} (wanted ${want})`);
          else if (want === null && [401, 403, 404].includes(res.status)) failures.push(`${where} (wanted the operation's own answer)`);
          else if (res.status >= 400 && typeof res.json?.error?.message !== 'string') failures.push(`${where} (no error message)`);
        }
      }
      expect(failures).toEqual([]);
    });
  }
});
