// Hostile input, property-based: every JSON route gets a few hundred bodies made by fast-check —
// arbitrary JSON, or a valid body with fields swapped for control characters, NUL, lone
// surrogates, huge strings, hex numbers, null, arrays and objects. Every answer must be a clean
// answer (never a 500; a 4xx says why in words), and a refused request changes nothing: the
// touched tables keep their row counts and checksum.
// @vitest-environment node
import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../support/http';

const RUNS = Number(process.env.HOSTILE_RUNS ?? 200);
const TABLES = [
  'companies',
  'users',
  'sites',
  'units',
  'service_calls',
  'diagnoses',
  'answers',
  'call_events',
  // Not the outbox: its worker sends what valid requests queued while the next requests run, which
  // would read as a refusal changing it (tests/e2e/api/report.test.ts counts what a refusal queues).
  'notification_settings',
  'practice_scenarios',
  'practice_assignments',
  'practice_attempts',
  'fault_trees',
  'tree_versions',
  'tree_events',
];

let db: Knex;
let admin: ApiClient;
let tech: ApiClient;
let companyBefore: Record<string, unknown> | null = null;
let technicianBefore: { id: string; name: string; role: string; active: boolean } | null = null;
const ids: Record<string, string> = {};

async function checksum(): Promise<string> {
  const parts = await Promise.all(
    TABLES.map(async (t) => {
      const row = await db(t).first(
        db.raw('count(*)::int as n'),
        db.raw(`md5(coalesce(string_agg(${t}::text, '|' order by id), '')) as h`),
      );
      return `${t}:${row.n}:${row.h}`;
    }),
  );
  return parts.join(' ');
}

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  admin = await signedIn(DEMO.admin);
  tech = await signedIn(DEMO.technician);
  companyBefore = (await admin.get('/api/company')).json;
  const version = (await tech.get('/api/trees')).json.find((t: any) => t.published).published.id;
  const site = await tech.post('/api/sites', { name: 'Hostile site', address: '1 Fuzz Row' });
  const unit = await tech.post('/api/units', {
    siteId: site.json.id,
    label: 'Hostile furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    transformerVa: 40,
  });
  const call = await tech.post('/api/calls', { unitId: unit.json.id, complaint: 'No heat (hostile)' });
  const diagnosis = await tech.post(`/api/calls/${call.json.id}/diagnoses`, { treeVersionId: version });
  const technician = await db('users').where({ email: DEMO.technician }).first('id', 'name', 'role', 'active');
  technicianBefore = technician;
  Object.assign(ids, {
    version,
    site: site.json.id,
    unit: unit.json.id,
    call: call.json.id,
    diagnosis: diagnosis.json.id,
    step: diagnosis.json.step.id,
    user: technician.id,
  });
});

// A sent e-mail on the hostile call, for the resend route.
beforeAll(async () => {
  const call = await db('service_calls').where({ id: ids.call }).first('company_id');
  const [row] = await db('outbox')
    .insert({
      company_id: call.company_id,
      call_id: ids.call,
      kind: 'report',
      idempotency_key: `hostile:${ids.call}`,
      recipients: JSON.stringify(['hostile@demo.test']),
      subject: 'Hostile report',
      body: 'Hostile',
      status: 'sent',
    })
    .returning('id');
  ids.outbox = row.id;
});

// Practice (h9ui): a scenario assigned to the demo apprentice with an open attempt on a real bench session.
let trainer: ApiClient;
let apprentice: ApiClient;
beforeAll(async () => {
  trainer = await signedIn(DEMO.trainer);
  apprentice = await signedIn(DEMO.apprentice);
  const overview = await trainer.get('/api/practice');
  ids.fault = overview.json.faults[0].id;
  ids.apprentice = overview.json.apprentices.find((a: { email: string }) => a.email === DEMO.apprentice).id;
  const scenario = await trainer.post('/api/practice/scenarios', {
    title: 'Hostile scenario',
    faultIds: [ids.fault],
    unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' },
  });
  ids.scenario = scenario.json.id;
  await trainer.post(`/api/practice/scenarios/${ids.scenario}/assignments`, { apprenticeIds: [ids.apprentice] });
  const assignment = (await apprentice.get('/api/practice/assignments')).json.find(
    (a: { scenarioId: string }) => a.scenarioId === ids.scenario,
  );
  ids.attempt = (await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {})).json.id;
});

// The bench (h9core): a session of the demo apprentice's own.
beforeAll(async () => {
  const session = await apprentice.post('/api/bench/sessions', {
    faultId: null,
    unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' },
    seed: 5,
  });
  ids.benchSession = session.json.id;
});

// Tree authoring (h8s): a tree of its own with a draft holding the built-in graph, and an export to import.
let treeLead: ApiClient;
const treeRefs: { graph?: unknown; document?: Record<string, unknown>; revision?: number } = {};
beforeAll(async () => {
  treeLead = await signedIn(DEMO.lead);
  const created = await treeLead.post('/api/trees', {
    title: `Hostile tree ${randomUUID().slice(0, 8)}`,
    symptom: 'No heat',
    equipmentKind: 'dsi-furnace',
  });
  ids.tree = created.json.treeId;
  ids.draft = created.json.id;
  treeRefs.graph = (await treeLead.get(`/api/tree-versions/${ids.version}/authoring`)).json.graph;
  treeRefs.revision = (
    await treeLead.call('PUT', `/api/tree-versions/${ids.draft}`, { baseRevision: 1, graph: treeRefs.graph })
  ).json.revision;
  const doc = (await treeLead.get(`/api/tree-versions/${ids.version}/export`)).json;
  treeRefs.document = { ...doc, tree: { ...doc.tree, slug: `hostile-import-${randomUUID().slice(0, 8)}` } };
});

afterAll(async () => {
  // A hostile body that happens to be valid changes the company (a random name): put it back for
  // the tests that read the demo company's name.
  if (companyBefore) {
    const { id: _id, ...settings } = companyBefore;
    await admin.patch('/api/company', settings);
  }
  // Likewise the demo technician's name, role and state (what the other tests greet and sign in as).
  if (technicianBefore) {
    const { id, ...row } = technicianBefore;
    await db('users').where({ id }).update(row);
  }
  // A valid body may turn one of the technician's notifications off: back to none off, as seeded.
  if (ids.user) await db('notification_settings').where({ user_id: ids.user }).del();
  await db.destroy();
});

const nasty = fc.oneof(
  fc.jsonValue(),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.constantFrom(
    '\u0000',
    'a\u0000b',
    '\u0007bell',
    '\ud800',
    'x'.repeat(5000),
    `${'a'.repeat(3000)}@demo.test`,
    '0x28',
    '4e1',
    'Infinity',
    ' ',
    '',
  ),
  fc.constantFrom(null, true, false, [], {}, -1, 0, 1e308, Number.MAX_SAFE_INTEGER),
);

/** Arbitrary JSON, or the valid body with some of its fields swapped for nasty values (and maybe an extra key). */
function bodies(valid: Record<string, unknown>) {
  const keys = Object.keys(valid);
  const mutated = fc
    .record({
      swaps: fc.subarray(keys, { minLength: 1 }),
      values: fc.array(nasty, { minLength: keys.length, maxLength: keys.length }),
      extra: fc.option(fc.tuple(fc.string({ maxLength: 10 }), nasty), { nil: undefined }),
    })
    .map(({ swaps, values, extra }) => {
      const body: Record<string, unknown> = { ...valid };
      swaps.forEach((k, i) => (body[k] = values[i]));
      if (extra) body[extra[0]] = extra[1];
      return body;
    });
  return keys.length ? fc.oneof({ weight: 1, arbitrary: fc.jsonValue() }, { weight: 3, arbitrary: mutated }) : fc.jsonValue();
}

interface Target {
  method: string;
  path: () => string;
  client: () => ApiClient;
  valid: () => Record<string, unknown>;
}

const TARGETS: Record<string, Target> = {
  'POST /api/auth/sign-in': {
    method: 'POST',
    path: () => '/api/auth/sign-in',
    client: () => new ApiClient(),
    valid: () => ({ email: 'nobody@demo.test', password: 'x' }),
  },
  'PATCH /api/company': {
    method: 'PATCH',
    path: () => '/api/company',
    client: () => admin,
    valid: () => ({
      name: 'Kestrel Valley Heating Co.',
      officeEmail: 'office@kestrel.demo.test',
      displayUnits: 'us',
      timeZone: 'America/Toronto',
    }),
  },
  'POST /api/users': {
    method: 'POST',
    path: () => '/api/users',
    client: () => admin,
    valid: () => ({ email: `fuzz-${randomUUID()}@demo.test`, name: 'Fuzz', role: 'apprentice', password: 'long-enough-123' }),
  },
  'PATCH /api/users/{id}': {
    method: 'PATCH',
    path: () => `/api/users/${ids.user}`,
    client: () => admin,
    valid: () => ({ name: 'Tech Nician' }),
  },
  'POST /api/sites': {
    method: 'POST',
    path: () => '/api/sites',
    client: () => tech,
    valid: () => ({ name: 'Fuzz site', address: '2 Fuzz Row', contactEmail: '' }),
  },
  'POST /api/units': {
    method: 'POST',
    path: () => '/api/units',
    client: () => tech,
    valid: () => ({
      siteId: ids.site,
      label: 'Fuzz furnace',
      ignition: 'two-rod',
      fuel: 'lp',
      controlSupply: 'line',
      transformerVa: 40,
      installYear: 2010,
    }),
  },
  'POST /api/calls': {
    method: 'POST',
    path: () => '/api/calls',
    client: () => tech,
    valid: () => ({ unitId: ids.unit, complaint: 'No heat' }),
  },
  'PUT /api/calls/{id}/repair': {
    method: 'PUT',
    path: () => `/api/calls/${ids.call}/repair`,
    client: () => tech,
    valid: () => ({
      repairNotes: 'Cleaned the rod',
      cycles: 3,
      flameSignal: '4.1',
      checks: [{ text: 'Three cycles', done: true }],
      notes: '',
    }),
  },
  'POST /api/calls/{id}/diagnoses': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/diagnoses`,
    client: () => tech,
    valid: () => ({ treeVersionId: ids.version }),
  },
  'PATCH /api/units/{id}': {
    method: 'PATCH',
    path: () => `/api/units/${ids.unit}`,
    client: () => tech,
    valid: () => ({ ignition: 'two-rod', fuel: 'natural-gas', controlSupply: '24v', draft: 'induced' }),
  },
  'POST /api/diagnoses/{id}/answers': {
    method: 'POST',
    path: () => `/api/diagnoses/${ids.diagnosis}/answers`,
    client: () => tech,
    valid: () => ({ clientId: randomUUID(), stepId: ids.step, text: '121', unit: 'VAC', choice: 'x', confirmed: true }),
  },
  'POST /api/calls/{id}/close': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/close`,
    client: () => tech,
    valid: () => ({ outcome: 'closed' }),
  },
  'POST /api/calls/{id}/assign': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/assign`,
    client: () => admin,
    valid: () => ({ technicianId: ids.user }),
  },
  'POST /api/calls/{id}/report-email': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/report-email`,
    client: () => tech,
    valid: () => ({ to: ['customer@demo.test'], subject: 'Service report', body: 'Attached.', idempotencyKey: randomUUID() }),
  },
  'POST /api/outbox/{id}/resend': {
    method: 'POST',
    path: () => `/api/outbox/${ids.outbox}/resend`,
    client: () => tech,
    valid: () => ({ idempotencyKey: randomUUID() }),
  },
  'PUT /api/me/notifications': {
    method: 'PUT',
    path: () => '/api/me/notifications',
    client: () => tech,
    valid: () => ({ 'sign-off': true, escalation: true, 'tree-review': true, scenario: true }),
  },
  'POST /api/practice/scenarios': {
    method: 'POST',
    path: () => '/api/practice/scenarios',
    client: () => trainer,
    valid: () => ({
      title: 'Fuzz scenario',
      faultIds: [ids.fault],
      unit: { controlSupply: 'line', ignition: 'single-rod', fuel: 'lp', draft: 'natural' },
      notes: 'Fuzz',
      dueOn: '2027-01-15',
    }),
  },
  'POST /api/practice/scenarios/{id}/assignments': {
    method: 'POST',
    path: () => `/api/practice/scenarios/${ids.scenario}/assignments`,
    client: () => trainer,
    valid: () => ({ apprenticeIds: [ids.apprentice] }),
  },
  // Tree authoring (h8s). A new tree with a taken short name is a 409; a save on the current revision
  // lands once, the rest are stale (409, nothing stored); the draft is never in review, so return is a 409.
  'POST /api/trees': {
    method: 'POST',
    path: () => '/api/trees',
    client: () => treeLead,
    valid: () => ({ title: 'Hostile tree', symptom: 'No heat', equipmentKind: 'dsi-furnace', slug: 'hostile-tree' }),
  },
  'POST /api/trees/{id}/drafts': {
    method: 'POST',
    path: () => `/api/trees/${ids.tree}/drafts`,
    client: () => treeLead,
    valid: () => ({ fromVersionId: ids.draft }),
  },
  'PUT /api/tree-versions/{id}': {
    method: 'PUT',
    path: () => `/api/tree-versions/${ids.draft}`,
    client: () => treeLead,
    valid: () => ({ baseRevision: treeRefs.revision, graph: treeRefs.graph }),
  },
  'POST /api/tree-versions/{id}/return': {
    method: 'POST',
    path: () => `/api/tree-versions/${ids.draft}/return`,
    client: () => treeLead,
    valid: () => ({ comments: [{ stepId: 'flame-signal', text: 'Which range?' }] }),
  },
  'POST /api/trees/import': {
    method: 'POST',
    path: () => '/api/trees/import',
    client: () => treeLead,
    valid: () => ({ document: treeRefs.document }),
  },
  'POST /api/bench/sessions': {
    method: 'POST',
    path: () => '/api/bench/sessions',
    client: () => apprentice,
    valid: () => ({ faultId: null, unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } }),
  },
  'POST /api/bench/sessions/{id}/actions': {
    method: 'POST',
    path: () => `/api/bench/sessions/${ids.benchSession}/actions`,
    client: () => apprentice,
    valid: () => ({ action: 'wait', seconds: 1 }),
  },
  'POST /api/bench/sessions/{id}/measure': {
    method: 'POST',
    path: () => `/api/bench/sessions/${ids.benchSession}/measure`,
    client: () => apprentice,
    valid: () => ({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' }),
  },
  'POST /api/bench/sessions/{id}/observe': {
    method: 'POST',
    path: () => `/api/bench/sessions/${ids.benchSession}/observe`,
    client: () => apprentice,
    valid: () => ({ what: 'spark' }),
  },
  // Before the finish below: a scored attempt's bench is closed.
  'POST /api/practice/attempts/{id}/bench/measure': {
    method: 'POST',
    path: () => `/api/practice/attempts/${ids.attempt}/bench/measure`,
    client: () => apprentice,
    valid: () => ({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' }),
  },
  // An answer of the attempt's walk: without a reading the bench gave, even a valid body is refused.
  'POST /api/practice/attempts/{id}/answers': {
    method: 'POST',
    path: () => `/api/practice/attempts/${ids.attempt}/answers`,
    client: () => apprentice,
    valid: () => ({ clientId: '00000000-0000-4000-8000-0000000000a1', stepId: 'line-voltage', text: '120', unit: 'VAC' }),
  },
  // A finding that gets through scores the attempt once; later ones are 409s.
  'POST /api/practice/attempts/{id}/finish': {
    method: 'POST',
    path: () => `/api/practice/attempts/${ids.attempt}/finish`,
    client: () => apprentice,
    valid: () => ({ findingStepId: 'f-no-line-power' }),
  },
  // After the answers: an escalation that gets through ends the diagnosis (later ones are 409s).
  'POST /api/diagnoses/{id}/escalate': {
    method: 'POST',
    path: () => `/api/diagnoses/${ids.diagnosis}/escalate`,
    client: () => tech,
    valid: () => ({ note: 'The meter reads nothing the steps offer' }),
  },
  // Last: a referral that gets through closes the call, and a reopen that gets through opens it again.
  'POST /api/calls/{id}/close (refer)': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/close`,
    client: () => tech,
    valid: () => ({ outcome: 'referred', reason: 'Part on order' }),
  },
  'POST /api/calls/{id}/reopen': {
    method: 'POST',
    path: () => `/api/calls/${ids.call}/reopen`,
    client: () => admin,
    valid: () => ({ reason: 'The customer called back' }),
  },
};

describe('hostile input on every JSON route', () => {
  for (const [label, target] of Object.entries(TARGETS)) {
    it(`${label}: ${RUNS} hostile bodies, a clean answer each, nothing changed by a refusal`, async () => {
      let before = await checksum();
      const problems: string[] = [];
      await fc.assert(
        fc.asyncProperty(bodies(target.valid()), async (body) => {
          const res = await target.client().call(target.method, target.path(), body);
          const shown = `${res.status} for ${JSON.stringify(body).slice(0, 160)}: ${res.text.slice(0, 160)}`;
          if (res.status >= 500) problems.push(shown);
          if (res.status >= 400) {
            if (typeof res.json?.error?.message !== 'string' || !res.json.error.message.trim()) problems.push(`no message: ${shown}`);
            const after = await checksum();
            if (after !== before) problems.push(`changed the tables: ${shown}`);
          } else {
            before = await checksum();
          }
          return res.status < 500;
        }),
        { numRuns: RUNS, endOnFailure: true },
      );
      expect(problems).toEqual([]);
    });
  }
});
