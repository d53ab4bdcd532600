// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { getTreeVersion, listTrees } from '@/db/trees';
import { DEFAULT_TREE, DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { NO_HEAT_DSI_R2 } from '@/lib/trees/builtin/no-heat-dsi-r2';
import { unmodifiedRevisionOf } from '@/lib/trees/builtin';
import { treeGraphSchema } from '@/lib/trees/schema';
import { AppError } from '@/lib/errors';
import { seed as seedTrees } from '@/seeds/02_fault_trees';

// The seeded default tree and the rule that a published version never changes, enforced by the
// database itself (trigger tree_versions_guard). Changes run inside a rolled-back transaction.

const ROLLBACK = new Error('rollback');

async function inRolledBackTransaction(fn: (trx: typeof db) => Promise<void>) {
  await db
    .transaction(async (trx) => {
      await fn(trx as unknown as typeof db);
      throw ROLLBACK;
    })
    .catch((e) => {
      if (e !== ROLLBACK) throw e;
    });
}

async function refused(promise: Promise<unknown>): Promise<string> {
  const error = await promise.then(
    () => null,
    (e: Error) => e,
  );
  expect(error, 'the database should have refused').toBeInstanceOf(Error);
  return (error as Error).message;
}

let companies: { id: string; name: string }[];

beforeAll(async () => {
  // The seeded companies: other test files make companies of their own while this one runs (some
  // with a tree of the same slug), and those are not the seed's to check.
  companies = await db('companies').whereLike('office_email', '%.demo.test').orderBy(['created_at', 'name']).select('id', 'name');
  expect(companies.length).toBeGreaterThanOrEqual(2);
});

afterAll(async () => {
  await db.destroy();
});

describe('the default tree', () => {
  it('is published as version 1 for every company, each with its own copy', async () => {
    const versionIds = new Set<string>();
    for (const company of companies) {
      const trees = await listTrees({ companyId: company.id });
      const tree = trees.find((t) => t.slug === DEFAULT_TREE.slug);
      expect(tree?.published?.version, company.name).toBe(1);
      versionIds.add(tree!.published!.id);
      const version = await getTreeVersion({ companyId: company.id, id: tree!.published!.id });
      expect(version.graph).toEqual(DEFAULT_TREE_GRAPH);
    }
    expect(versionIds.size).toBe(companies.length);
  });

  it("answers not_found for another company's version", async () => {
    const [a, b] = companies;
    const tree = (await listTrees({ companyId: a.id })).find((t) => t.slug === DEFAULT_TREE.slug)!;
    const error = await getTreeVersion({ companyId: b.id, id: tree.published!.id }).then(
      () => null,
      (e) => e,
    );
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe('not_found');
  });
});

describe('built-in revisions', () => {
  it('knows an unmodified copy of each revision, and not an edited one', () => {
    expect(unmodifiedRevisionOf(JSON.parse(JSON.stringify(treeGraphSchema.parse(NO_HEAT_DSI_R1.graph))))).toBe(1);
    expect(unmodifiedRevisionOf(JSON.parse(JSON.stringify(treeGraphSchema.parse(NO_HEAT_DSI_R2.graph))))).toBe(2);
    expect(unmodifiedRevisionOf(DEFAULT_TREE_GRAPH)).toBe(3);
    expect(DEFAULT_TREE.revision).toBe(3);
    const edited = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);
    edited.steps[0] = { ...edited.steps[0], title: 'Line voltage, our way' };
    expect(unmodifiedRevisionOf(edited)).toBeNull();
    const editedR2 = treeGraphSchema.parse(NO_HEAT_DSI_R2.graph);
    editedR2.steps[0] = { ...editedR2.steps[0], title: 'Line voltage, our way' };
    expect(unmodifiedRevisionOf(editedR2)).toBeNull();
  });

  it('publishes the current revision on start for a company still on an unmodified earlier one, once; an edited tree is left alone', async () => {
    await inRolledBackTransaction(async (trx) => {
      const r1 = JSON.stringify(treeGraphSchema.parse(NO_HEAT_DSI_R1.graph));
      // Revision 2 as the store keeps it: its defaults left out (the raw authored graph).
      const r2 = JSON.stringify(NO_HEAT_DSI_R2.graph);
      const edited = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);
      edited.steps[0] = { ...edited.steps[0], title: 'Line voltage, our way' };
      const editedR2 = treeGraphSchema.parse(NO_HEAT_DSI_R2.graph);
      editedR2.steps[1] = { ...editedR2.steps[1], why: 'Our own note on the trial.' };
      const made: Record<string, { companyId: string; treeId: string; versionId: string }> = {};
      for (const [name, graph] of [
        ['Untouched Heating', r1],
        ['Second Heating', r2],
        ['Edited Heating', JSON.stringify(edited)],
        ['Edited-Second Heating', JSON.stringify(editedR2)],
      ] as const) {
        const [company] = await trx('companies')
          .insert({ name, office_email: `${name.split(' ')[0].toLowerCase()}@example.test` })
          .returning('id');
        const [tree] = await trx('fault_trees')
          .insert({
            company_id: company.id,
            slug: DEFAULT_TREE.slug,
            title: DEFAULT_TREE.title,
            symptom: 'No heat',
            equipment_kind: 'dsi-furnace',
          })
          .returning('id');
        const [version] = await trx('tree_versions')
          .insert({ company_id: company.id, tree_id: tree.id, version: 1, status: 'published', graph, published_at: trx.fn.now() })
          .returning('id');
        made[name] = { companyId: company.id, treeId: tree.id, versionId: version.id };
      }
      await seedTrees(trx);
      await seedTrees(trx); // a second start publishes nothing more

      const versions = async (treeId: string) =>
        trx('tree_versions').where({ tree_id: treeId }).orderBy('version').select('version', 'status', 'graph', 'builtin_revision');
      const untouched = await versions(made['Untouched Heating'].treeId);
      expect(untouched.map((v) => [v.version, v.status, v.builtin_revision])).toEqual([
        [1, 'retired', null],
        [2, 'published', 3],
      ]);
      expect(treeGraphSchema.parse(untouched[1].graph)).toEqual(DEFAULT_TREE_GRAPH);
      const second = await versions(made['Second Heating'].treeId);
      expect(second.map((v) => [v.version, v.status, v.builtin_revision])).toEqual([
        [1, 'retired', null],
        [2, 'published', 3],
      ]);
      expect(treeGraphSchema.parse(second[1].graph)).toEqual(DEFAULT_TREE_GRAPH);
      // The retired revision 2 keeps its graph (diagnoses on it keep it).
      expect(treeGraphSchema.parse(second[0].graph)).toEqual(treeGraphSchema.parse(NO_HEAT_DSI_R2.graph));
      for (const name of ['Edited Heating', 'Edited-Second Heating']) {
        const editedVersions = await versions(made[name].treeId);
        expect(
          editedVersions.map((v) => [v.version, v.status]),
          name,
        ).toEqual([[1, 'published']]);
      }
    });
  });
});

describe('published versions never change', () => {
  let versionId: string;
  beforeAll(async () => {
    const tree = (await listTrees({ companyId: companies[0].id })).find((t) => t.slug === DEFAULT_TREE.slug)!;
    versionId = tree.published!.id;
  });

  it('refuses a change of graph, number or publication time', async () => {
    await inRolledBackTransaction(async (trx) => {
      expect(
        await refused(
          trx('tree_versions')
            .where({ id: versionId })
            .update({ graph: JSON.stringify({ start: 'x', steps: [] }) }),
        ),
      ).toMatch(/published and cannot change/);
    });
    await inRolledBackTransaction(async (trx) => {
      expect(await refused(trx('tree_versions').where({ id: versionId }).update({ version: 99 }))).toMatch(/cannot change/);
    });
    await inRolledBackTransaction(async (trx) => {
      expect(await refused(trx('tree_versions').where({ id: versionId }).update({ status: 'draft' }))).toMatch(/cannot change/);
    });
  });

  it('refuses deletion, but allows retiring', async () => {
    await inRolledBackTransaction(async (trx) => {
      expect(await refused(trx('tree_versions').where({ id: versionId }).delete())).toMatch(/cannot be deleted/);
    });
    await inRolledBackTransaction(async (trx) => {
      await trx('tree_versions').where({ id: versionId }).update({ status: 'retired' });
      const row = await trx('tree_versions').where({ id: versionId }).first('status');
      expect(row.status).toBe('retired');
    });
    expect((await db('tree_versions').where({ id: versionId }).first('status')).status).toBe('published');
  });

  it('lets a draft change freely', async () => {
    await inRolledBackTransaction(async (trx) => {
      const tree = await trx('fault_trees').where({ company_id: companies[0].id, slug: DEFAULT_TREE.slug }).first('id');
      const [draft] = await trx('tree_versions')
        .insert({
          company_id: companies[0].id,
          tree_id: tree.id,
          version: 1000 + Math.floor(Math.random() * 1000),
          status: 'draft',
          graph: JSON.stringify(DEFAULT_TREE_GRAPH),
        })
        .returning('id');
      await trx('tree_versions')
        .where({ id: draft.id })
        .update({ graph: JSON.stringify({ ...DEFAULT_TREE_GRAPH, start: 'control-supply' }) });
      await trx('tree_versions').where({ id: draft.id }).delete();
    });
  });
});

describe('answers', () => {
  it('are unique per diagnosis and client id', async () => {
    await inRolledBackTransaction(async (trx) => {
      const company = companies[0].id;
      const version = await trx('tree_versions').where({ company_id: company, status: 'published' }).first('id');
      const unit = await trx('units').where({ company_id: company }).first('id');
      const [call] = await trx('service_calls').insert({ company_id: company, unit_id: unit.id, complaint: 'db test' }).returning('id');
      const [diagnosis] = await trx('diagnoses')
        .insert({ company_id: company, call_id: call.id, tree_version_id: version.id })
        .returning('id');
      const clientId = randomUUID();
      const row = { company_id: company, diagnosis_id: diagnosis.id, client_id: clientId, step_id: 'line-voltage', step_kind: 'measure' };
      await trx('answers').insert({ ...row, seq: 1 });
      expect(await refused(trx('answers').insert({ ...row, seq: 2 }))).toMatch(/duplicate key|unique/);
    });
  });
});
