// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { createUser } from '@/db/users';
import { AppError } from '@/lib/errors';
import { reachOf, type OperationName, type Scope } from '@/lib/policy';
import { ROLES, type Role } from '@/lib/roles';
import { getCompanyTreeUsage, getTreeUsage } from '@/lib/server/tree-usage';
import { seed as seedTrees } from '@/seeds/02_fault_trees';
import {
  approveVersion,
  builtinUpdateOf,
  createTree,
  diffVersions,
  exportVersion,
  getTreeForAuthoring,
  getVersionForAuthoring,
  importTree,
  listReviewsWaiting,
  listTreesForAuthoring,
  publishVersion,
  readTreeVersion,
  returnVersion,
  saveDraft,
  startDraft,
  submitVersion,
  validateVersion,
} from '@/lib/server/trees';
import { CURRENT_BUILTIN } from '@/lib/trees/builtin';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { DraftGraph } from '@/lib/validations/trees';

// Tree authoring against the real PostgreSQL: every workflow transition, who may make it, the 409
// paths (stale saves, a version not in the status a change needs, two changes at once), and that a
// published version never changes. Everything happens in a company of this file's own, with its
// own copy of the built-in tree.

const tag = randomUUID().slice(0, 8);
let companyId: string;
const people = {} as Record<'lead' | 'lead2' | 'admin' | 'technician', string>;
const scopeOf = (userId: string): Scope => ({ companyId, userId, reach: 'company' });

/** The built-in graph as a plain draft graph (what the editor sends). */
const builtinGraph = (): DraftGraph => JSON.parse(JSON.stringify(DEFAULT_TREE_GRAPH));

async function refusal(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error, 'should have been refused').toBeInstanceOf(AppError);
  return error as AppError;
}

async function dbRefuses(promise: Promise<unknown>): Promise<string> {
  const error = await promise.then(
    () => null,
    (e: Error) => e,
  );
  expect(error, 'the database should have refused').toBeInstanceOf(Error);
  return (error as Error).message;
}

const status = async (id: string) => (await db('tree_versions').where({ id }).first('status')).status as string;

beforeAll(async () => {
  // The company and its copy of the built-in tree in one transaction, so the tests that look at every
  // company's built-in tree never see this one without it.
  await db.transaction(async (trx) => {
    [{ id: companyId }] = await trx('companies')
      .insert({ name: `Authoring ${tag}`, office_email: `office-${tag}@authoring.test` })
      .returning('id');
    await seedTrees(trx);
  });
  for (const role of ['lead', 'lead2', 'admin', 'technician'] as const) {
    const user = await createUser({
      companyId,
      email: `${role}-${tag}@authoring.test`,
      name: `${role} ${tag}`,
      role: role === 'lead2' ? 'lead' : role,
      passwordHash: 'x',
    });
    people[role] = user.id;
  }
});

// The company stays: its published versions cannot be deleted (the guard trigger), which is the point.
afterAll(async () => {
  await db.destroy();
});

/** A tree whose draft holds the built-in graph, ready to submit. */
async function treeWithDraft(by = people.lead) {
  const created = await createTree({
    scope: scopeOf(by),
    input: { title: `No heat ${randomUUID().slice(0, 6)}`, symptom: 'No heat', equipmentKind: 'dsi-furnace' },
  });
  const saved = await saveDraft({ scope: scopeOf(by), id: created.id, baseRevision: created.revision, graph: builtinGraph() });
  expect(saved.outcome).toBe('saved');
  return { treeId: created.treeId, id: created.id, revision: saved.outcome === 'saved' ? saved.revision : 0 };
}

async function published(by = people.lead, approver = people.lead2) {
  const t = await treeWithDraft(by);
  await submitVersion({ scope: scopeOf(by), id: t.id, who: 'author' });
  await approveVersion({ scope: scopeOf(approver), id: t.id });
  await publishVersion({ scope: scopeOf(approver), id: t.id });
  return t;
}

describe('who may author (the policy table)', () => {
  const writes: OperationName[] = [
    'trees.create',
    'trees.startDraft',
    'trees.import',
    'treeVersions.save',
    'treeVersions.submit',
    'treeVersions.approve',
    'treeVersions.return',
    'treeVersions.publish',
  ];
  it.each(ROLES.map((r) => [r]))('%s', (role: Role) => {
    for (const op of writes) expect(reachOf(op, role), `${role} ${op}`).toBe(role === 'lead' || role === 'admin' ? 'company' : null);
    // Everyone signed in reads a published version.
    expect(reachOf('treeVersions.get', role)).toBe('company');
  });
});

describe('a new tree and its drafts', () => {
  it('starts from scratch at revision 1, with the problems listed', async () => {
    const created = await createTree({
      scope: scopeOf(people.lead),
      input: { title: `Scratch ${tag}`, symptom: 'No heat', equipmentKind: 'dsi-furnace' },
    });
    expect(created).toMatchObject({ status: 'draft', revision: 1, version: 1 });
    const v = await getVersionForAuthoring({ scope: scopeOf(people.lead), id: created.id });
    expect(v.problems.length).toBeGreaterThan(0);
    const slug = (await db('fault_trees').where({ id: created.treeId }).first('slug')).slug;
    expect(slug).toBe(`scratch-${tag}`);
    const again = await refusal(
      createTree({ scope: scopeOf(people.lead), input: { title: `Scratch ${tag}`, symptom: 'No heat', equipmentKind: 'x' } }),
    );
    expect(again.code).toBe('conflict');
  });

  it('copies a version into a new draft with the next number', async () => {
    const t = await published();
    const copy = await startDraft({ scope: scopeOf(people.lead2), treeId: t.treeId, fromVersionId: t.id });
    expect(copy).toMatchObject({ status: 'draft', revision: 1, version: 2 });
    const v = await getVersionForAuthoring({ scope: scopeOf(people.lead2), id: copy.id });
    expect(v.graph).toEqual(builtinGraph());
    expect(v.basedOnId).toBe(t.id);
    expect(v.author?.id).toBe(people.lead2);
  });

  it('refuses to copy a version of another tree', async () => {
    const a = await treeWithDraft();
    const b = await treeWithDraft();
    const error = await refusal(startDraft({ scope: scopeOf(people.lead), treeId: a.treeId, fromVersionId: b.id }));
    expect(error.code).toBe('bad_request');
  });
});

describe('saving a draft', () => {
  it('raises the revision; a stale save stores nothing and answers with the current graph', async () => {
    const t = await treeWithDraft();
    const mine = builtinGraph();
    mine.steps[0] = { ...mine.steps[0], title: 'Mine' };
    const first = await saveDraft({ scope: scopeOf(people.lead), id: t.id, baseRevision: t.revision, graph: mine });
    expect(first).toMatchObject({ outcome: 'saved', revision: t.revision + 1, problems: [] });

    const theirs = builtinGraph();
    theirs.steps[0] = { ...theirs.steps[0], title: 'Theirs' };
    const stale = await saveDraft({ scope: scopeOf(people.lead2), id: t.id, baseRevision: t.revision, graph: theirs });
    expect(stale.outcome).toBe('stale');
    if (stale.outcome !== 'stale') return;
    expect(stale.current.revision).toBe(t.revision + 1);
    expect((stale.current.graph.steps[0] as { title: string }).title).toBe('Mine');
    const row = await db('tree_versions').where({ id: t.id }).first('revision', 'graph');
    expect(row.revision).toBe(t.revision + 1);
    expect(row.graph.steps[0].title).toBe('Mine');
  });

  it('of two saves on the same revision at once, exactly one lands', async () => {
    const t = await treeWithDraft();
    const results = await Promise.all(
      [1, 2, 3].map((n) => {
        const g = builtinGraph();
        g.steps[0] = { ...g.steps[0], title: `Save ${n}` };
        return saveDraft({ scope: scopeOf(people.lead), id: t.id, baseRevision: t.revision, graph: g });
      }),
    );
    expect(results.filter((r) => r.outcome === 'saved')).toHaveLength(1);
    expect(results.filter((r) => r.outcome === 'stale')).toHaveLength(2);
  });

  it('stores a draft with problems and lists them (an unconnected choice)', async () => {
    const t = await treeWithDraft();
    const g = builtinGraph();
    const inspect = g.steps.findIndex((s) => s.kind === 'inspect');
    const step = g.steps[inspect] as { id: string; choices: { outcome?: string }[] };
    delete step.choices[0].outcome;
    const saved = await saveDraft({ scope: scopeOf(people.lead), id: t.id, baseRevision: t.revision, graph: g });
    expect(saved.outcome).toBe('saved');
    if (saved.outcome !== 'saved') return;
    expect(saved.problems.length).toBeGreaterThan(0);
    const validation = await validateVersion({ scope: scopeOf(people.lead), id: t.id });
    expect(validation.ok).toBe(false);
    // A draft with problems is saved, never submitted.
    const error = await refusal(submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' }));
    expect(error.code).toBe('unprocessable');
    expect(await status(t.id)).toBe('draft');
  });
});

describe('the workflow', () => {
  it('draft → in review → (author refused) → approved by another lead → published, retiring the one before', async () => {
    const first = await published();
    // A diagnosis running on the first version keeps it.
    const [site] = await db('sites').insert({ company_id: companyId, name: 'S', address: 'A' }).returning('id');
    const [unit] = await db('units')
      .insert({
        company_id: companyId,
        site_id: site.id,
        label: 'U',
        ignition: 'two-rod',
        fuel: 'natural-gas',
        control_supply: '24v',
        transformer_va: 40,
      })
      .returning('id');
    const [call] = await db('service_calls').insert({ company_id: companyId, unit_id: unit.id, complaint: 'No heat' }).returning('id');
    const [diagnosis] = await db('diagnoses')
      .insert({ company_id: companyId, call_id: call.id, tree_version_id: first.id, user_id: people.technician })
      .returning('id');

    const draft = await startDraft({ scope: scopeOf(people.lead), treeId: first.treeId, fromVersionId: first.id });
    const g = builtinGraph();
    const flame = g.steps.find((s) => s.id === 'flame-signal') as { bands: { from?: number; to?: number }[] };
    flame.bands[2].to = 1.5;
    flame.bands[3].from = 1.5;
    const saved = await saveDraft({ scope: scopeOf(people.lead), id: draft.id, baseRevision: draft.revision, graph: g });
    expect(saved.outcome).toBe('saved');

    const submitted = await submitVersion({ scope: scopeOf(people.lead), id: draft.id, who: 'lead' });
    expect(submitted.status).toBe('in_review');
    // In review, the graph is fixed.
    const editing = await refusal(saveDraft({ scope: scopeOf(people.lead), id: draft.id, baseRevision: 2, graph: g }));
    expect(editing.code).toBe('conflict');

    const own = await refusal(approveVersion({ scope: scopeOf(people.lead), id: draft.id }));
    expect(own.code).toBe('forbidden');
    expect(await status(draft.id)).toBe('in_review');
    // Not approved yet: cannot be published.
    expect((await refusal(publishVersion({ scope: scopeOf(people.lead2), id: draft.id }))).code).toBe('conflict');

    const diff = await diffVersions({ scope: scopeOf(people.lead2), id: draft.id, against: first.id });
    expect(diff.changed.map((c) => c.stepId)).toEqual(['flame-signal']);

    expect((await approveVersion({ scope: scopeOf(people.lead2), id: draft.id })).status).toBe('approved');
    const done = await publishVersion({ scope: scopeOf(people.lead2), id: draft.id });
    expect(done).toMatchObject({ status: 'published', retiredId: first.id });
    expect(await status(first.id)).toBe('retired');
    expect((await db('diagnoses').where({ id: diagnosis.id }).first('tree_version_id')).tree_version_id).toBe(first.id);

    const detail = await getTreeForAuthoring({ scope: scopeOf(people.lead), treeId: first.treeId });
    const kinds = detail.events.map((e) => `${e.kind}:${e.version}`);
    for (const k of ['created:1', 'edited:1', 'submitted:1', 'approved:1', 'published:1', 'retired:1', 'draft-started:2', 'published:2']) {
      expect(kinds).toContain(k);
    }
    const list = await listTreesForAuthoring({ scope: scopeOf(people.lead) });
    expect(list.find((t) => t.id === first.treeId)?.published?.id).toBe(draft.id);
  });

  it('an admin approves a lead’s version; an admin’s own is refused like anyone’s', async () => {
    const t = await treeWithDraft(people.lead);
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    expect((await approveVersion({ scope: scopeOf(people.admin), id: t.id })).status).toBe('approved');

    const mine = await treeWithDraft(people.admin);
    await submitVersion({ scope: scopeOf(people.admin), id: mine.id, who: 'admin' });
    expect((await refusal(approveVersion({ scope: scopeOf(people.admin), id: mine.id }))).code).toBe('forbidden');
  });

  it('a lead who edited someone else’s draft cannot approve it either', async () => {
    const t = await treeWithDraft(people.lead);
    const g = builtinGraph();
    g.steps[0] = { ...g.steps[0], title: 'Edited by the second lead' };
    await saveDraft({ scope: scopeOf(people.lead2), id: t.id, baseRevision: t.revision, graph: g });
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    expect((await refusal(approveVersion({ scope: scopeOf(people.lead2), id: t.id }))).code).toBe('forbidden');
    expect((await approveVersion({ scope: scopeOf(people.admin), id: t.id })).status).toBe('approved');
  });

  it('a reviewer sends it back with comments per step; it is a draft again and can be edited', async () => {
    const t = await treeWithDraft();
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    const back = await returnVersion({
      scope: scopeOf(people.lead2),
      id: t.id,
      comments: [{ stepId: 'flame-signal', text: 'Say which meter range.' }, { text: 'Otherwise fine.' }],
    });
    expect(back.status).toBe('draft');
    const v = await getVersionForAuthoring({ scope: scopeOf(people.lead), id: t.id });
    expect(v.reviewComments).toEqual([{ stepId: 'flame-signal', text: 'Say which meter range.' }, { text: 'Otherwise fine.' }]);
    expect(v.returnedBy?.id).toBe(people.lead2);
    const saved = await saveDraft({ scope: scopeOf(people.lead), id: t.id, baseRevision: v.revision, graph: builtinGraph() });
    expect(saved.outcome).toBe('saved');
    // Returning a draft is not a thing.
    expect((await refusal(returnVersion({ scope: scopeOf(people.lead2), id: t.id, comments: [{ text: 'x' }] }))).code).toBe('conflict');
  });

  it('of two approvals at once one lands; of two publishes at once one lands', async () => {
    const t = await treeWithDraft();
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    const approvals = await Promise.allSettled([
      approveVersion({ scope: scopeOf(people.lead2), id: t.id }),
      approveVersion({ scope: scopeOf(people.admin), id: t.id }),
    ]);
    expect(approvals.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const lost = approvals.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect((lost.reason as AppError).code).toBe('conflict');

    const publishes = await Promise.allSettled([
      publishVersion({ scope: scopeOf(people.lead2), id: t.id }),
      publishVersion({ scope: scopeOf(people.admin), id: t.id }),
    ]);
    expect(publishes.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    expect(((publishes.find((r) => r.status === 'rejected') as PromiseRejectedResult).reason as AppError).code).toBe('conflict');
    expect(await db('tree_versions').where({ tree_id: t.treeId, status: 'published' }).count('* as n').first()).toEqual({ n: '1' });
  });
});

describe('reviews waiting', () => {
  it('lists a submitted version for the other leads and admins, not for its author', async () => {
    const t = await treeWithDraft(people.lead);
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    expect((await listReviewsWaiting({ scope: scopeOf(people.lead2) })).map((r) => r.id)).toContain(t.id);
    expect((await listReviewsWaiting({ scope: scopeOf(people.admin) })).map((r) => r.id)).toContain(t.id);
    expect((await listReviewsWaiting({ scope: scopeOf(people.lead) })).map((r) => r.id)).not.toContain(t.id);
  });
});

describe('published versions never change', () => {
  it('the database refuses a change of graph, revision or status back, and a delete', async () => {
    const t = await published();
    expect(
      await dbRefuses(
        db('tree_versions')
          .where({ id: t.id })
          .update({ graph: JSON.stringify({ start: 'x', steps: [] }) }),
      ),
    ).toMatch(/cannot change/);
    expect(await dbRefuses(db('tree_versions').where({ id: t.id }).update({ revision: 99 }))).toMatch(/cannot change/);
    expect(await dbRefuses(db('tree_versions').where({ id: t.id }).update({ status: 'draft' }))).toMatch(/cannot change/);
    expect(await dbRefuses(db('tree_versions').where({ id: t.id }).delete())).toMatch(/cannot be deleted/);
    // Through the service: not a draft.
    expect((await refusal(saveDraft({ scope: scopeOf(people.lead), id: t.id, baseRevision: 2, graph: builtinGraph() }))).code).toBe(
      'conflict',
    );
  });

  it('the database lets the status move only along the workflow', async () => {
    const t = await treeWithDraft();
    expect(await dbRefuses(db('tree_versions').where({ id: t.id }).update({ status: 'published' }))).toMatch(
      /cannot go from draft to published/,
    );
    expect(await dbRefuses(db('tree_versions').where({ id: t.id }).update({ status: 'approved' }))).toMatch(
      /cannot go from draft to approved/,
    );
    await submitVersion({ scope: scopeOf(people.lead), id: t.id, who: 'lead' });
    expect(
      await dbRefuses(
        db('tree_versions')
          .where({ id: t.id })
          .update({ graph: JSON.stringify({ ...builtinGraph(), start: 'flame-signal' }) }),
      ),
    ).toMatch(/not a draft/);
  });
});

describe('reading versions', () => {
  it('a draft is not there for a technician; a published version is', async () => {
    const t = await treeWithDraft();
    const tech = { scope: scopeOf(people.technician), role: 'technician' as const };
    expect((await refusal(readTreeVersion({ ...tech, id: t.id }))).code).toBe('not_found');
    expect((await readTreeVersion({ scope: scopeOf(people.lead), role: 'lead', id: t.id })).status).toBe('draft');
    const p = await published();
    expect(await readTreeVersion({ ...tech, id: p.id })).toMatchObject({ status: 'published', revision: 2 });
  });

  it('a draft that does not parse yet is not found for a technician, a conflict for a lead', async () => {
    const created = await createTree({ scope: scopeOf(people.lead), input: { title: `Raw ${tag}`, symptom: 'x', equipmentKind: 'x' } });
    expect((await refusal(readTreeVersion({ scope: scopeOf(people.technician), role: 'technician', id: created.id }))).code).toBe(
      'not_found',
    );
    expect((await refusal(readTreeVersion({ scope: scopeOf(people.lead), role: 'lead', id: created.id }))).code).toBe('conflict');
  });
});

describe('export and import', () => {
  it('round-trips a published version into a new draft of the same tree', async () => {
    const t = await published();
    const doc = await exportVersion({ scope: scopeOf(people.lead), id: t.id });
    const imported = await importTree({ scope: scopeOf(people.lead), document: JSON.parse(JSON.stringify(doc)) });
    expect(imported.treeId).toBe(t.treeId);
    expect(imported.status).toBe('draft');
    const v = await getVersionForAuthoring({ scope: scopeOf(people.lead), id: imported.id });
    expect(v.problems).toEqual([]);
    expect(v.graph).toEqual(builtinGraph());
  });

  it('a malformed document stores nothing and says where it is wrong', async () => {
    const t = await published();
    const doc = JSON.parse(JSON.stringify(await exportVersion({ scope: scopeOf(people.lead), id: t.id })));
    doc.tree.slug = `imported-${tag}`;
    delete doc.graph.steps[1].title;
    const before = await db('tree_versions').where({ company_id: companyId }).count('* as n').first();
    const trees = await db('fault_trees').where({ company_id: companyId }).count('* as n').first();
    const error = await refusal(importTree({ scope: scopeOf(people.lead), document: doc }));
    expect(error.code).toBe('bad_request');
    expect(Object.keys(error.fieldErrors ?? {})).toContain('document.graph.steps[1].title');
    expect(await db('tree_versions').where({ company_id: companyId }).count('* as n').first()).toEqual(before);
    expect(await db('fault_trees').where({ company_id: companyId }).count('* as n').first()).toEqual(trees);
  });
});

describe('built-in updates', () => {
  const tree = { slug: 'no-heat-dsi', published: { id: 'v' } };
  it('are offered when no version of the tree is, or started from, the shipped revision', () => {
    const shipped = CURRENT_BUILTIN.revision;
    expect(builtinUpdateOf({ ...tree, builtinSeen: shipped - 1 })).toMatchObject({ revision: shipped, publishedVersionId: 'v' });
    expect(builtinUpdateOf({ ...tree, builtinSeen: null })).toMatchObject({ revision: shipped });
    expect(builtinUpdateOf({ ...tree, builtinSeen: shipped })).toBeNull();
    expect(builtinUpdateOf({ ...tree, slug: 'our-own', builtinSeen: null })).toBeNull();
    expect(builtinUpdateOf({ ...tree, published: null, builtinSeen: 1 })).toBeNull();
  });
});

describe('usage', () => {
  it('counts diagnoses, findings and where they stopped per version; first-time fix and median time to a finding for the company', async () => {
    const t = await published();
    const [site] = await db('sites').insert({ company_id: companyId, name: 'Usage site', address: '1 Usage Rd' }).returning('id');
    const unit = async (label: string) =>
      (
        await db('units')
          .insert({
            company_id: companyId,
            site_id: site.id,
            label,
            ignition: 'two-rod',
            fuel: 'natural-gas',
            control_supply: '24v',
            transformer_va: 40,
          })
          .returning('id')
      )[0].id as string;
    const [u1, u2, u3] = [await unit('U1'), await unit('U2'), await unit('U3')];
    const day = 24 * 3600 * 1000;
    const now = Date.now();
    const call = async (unitId: string, fields: Record<string, unknown> = {}) =>
      (
        await db('service_calls')
          .insert({ company_id: companyId, unit_id: unitId, complaint: 'No heat', ...fields })
          .returning('id')
      )[0].id as string;
    // Closed 40 days ago and back 10 days later; closed 40 days ago and not back; closed 2 days ago.
    const c1 = await call(u1, { status: 'closed', opened_at: new Date(now - 41 * day), closed_at: new Date(now - 40 * day) });
    await call(u1, { opened_at: new Date(now - 30 * day) });
    const c2 = await call(u2, { status: 'closed', opened_at: new Date(now - 41 * day), closed_at: new Date(now - 40 * day) });
    await call(u3, { status: 'closed', opened_at: new Date(now - 3 * day), closed_at: new Date(now - 2 * day) });

    const t0 = new Date(now - 39 * day).getTime();
    const minutes = (m: number) => new Date(t0 + m * 60_000);
    async function diagnosis(callId: string, fields: Record<string, unknown>, answers: [string, number][]) {
      const [d] = await db('diagnoses')
        .insert({ company_id: companyId, call_id: callId, tree_version_id: t.id, started_at: minutes(0), ...fields })
        .returning('id');
      let seq = 0;
      for (const [stepId, at] of answers) {
        seq += 1;
        await db('answers').insert({
          company_id: companyId,
          diagnosis_id: d.id,
          client_id: randomUUID(),
          seq,
          step_id: stepId,
          step_kind: 'measure',
          created_at: minutes(at),
        });
      }
    }
    const found = (finding: string) => ({ status: 'found', finding_step_id: finding, current_state: finding });
    await diagnosis(c1, found('f-control-not-sensing'), [
      ['line-voltage', 0],
      ['flame-signal', 10],
      ['verify--f-control-not-sensing', 40],
    ]);
    await diagnosis(c2, found('f-control-not-sensing'), [
      ['line-voltage', 0],
      ['flame-signal', 20],
    ]);
    await diagnosis(c2, found('f-no-line-power'), [
      ['line-voltage', 0],
      ['thermostat-call', 30],
    ]);
    await diagnosis(c1, { status: 'escalated', escalation_note: 'Reads nothing offered', current_state: 'flame-signal' }, [
      ['line-voltage', 0],
    ]);
    // In progress on a closed call: abandoned, at the step its procedure leads to.
    await diagnosis(c2, { status: 'in_progress', current_state: 'lock-out--spark-gap' }, []);

    const usage = await getTreeUsage({ scope: scopeOf(people.lead), treeId: t.treeId });
    const v = usage.versions.find((x) => x.id === t.id)!;
    expect(v).toMatchObject({ diagnoses: 5, found: 3, escalated: 1, inProgress: 1 });
    expect(v.findings.map((f) => [f.stepId, f.count])).toEqual([
      ['f-control-not-sensing', 2],
      ['f-no-line-power', 1],
    ]);
    expect(v.findings[0].title).toBe(DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'f-control-not-sensing')!.title);
    expect(v.stops).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ stepId: 'flame-signal', escalated: 1, abandoned: 0 }),
        expect.objectContaining({ stepId: 'spark-gap', escalated: 0, abandoned: 1 }),
      ]),
    );

    const company = await getCompanyTreeUsage({ scope: scopeOf(people.lead) });
    expect(company.firstTimeFix).toMatchObject({ closed: 3, returned: 1, windowOpen: 1 });
    expect(company.firstTimeFix.rate).toBeCloseTo(2 / 3);
    // 10, 20 and 30 minutes from the first answer to the last tree step before the finding: median 20 min.
    expect(company.timeToFinding).toEqual({ medianSeconds: 1200, diagnoses: 3 });
    const month = company.months.flatMap((m) => m.findings).find((f) => f.stepId === 'f-control-not-sensing');
    expect(month?.count).toBe(2);
  });
});
