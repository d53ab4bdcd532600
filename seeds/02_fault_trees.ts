import type { Knex } from 'knex';
import { CURRENT_BUILTIN, unmodifiedRevisionOf } from '@/lib/trees/builtin';
import { validateGraph } from '@/lib/trees/validate';

// Every company gets its own copy of the built-in tree as published version 1 (not demo data: a
// company needs a tree to diagnose with). A company whose published built-in tree is an unmodified
// earlier revision gets the current revision published as its next version; the earlier version is
// retired and keeps the diagnoses that ran on it. A company that edited its tree is not touched.
export async function seed(knex: Knex): Promise<void> {
  const tree = CURRENT_BUILTIN;
  const checked = validateGraph(tree.graph);
  if (!checked.ok) {
    throw new Error(`The built-in tree does not validate:\n${checked.problems.map((p) => `- ${p.stepId ?? ''}: ${p.message}`).join('\n')}`);
  }
  const graph = JSON.stringify(checked.graph);

  const companies: { id: string }[] = await knex('companies')
    .whereNotExists(knex('fault_trees').whereRaw('fault_trees.company_id = companies.id').andWhere('slug', tree.slug))
    .select('id');
  for (const company of companies) {
    await knex.transaction(async (trx) => {
      const [row] = await trx('fault_trees')
        .insert({ company_id: company.id, slug: tree.slug, title: tree.title, symptom: tree.symptom, equipment_kind: tree.equipmentKind })
        .returning('id');
      await trx('tree_versions').insert({
        company_id: company.id,
        tree_id: row.id,
        version: 1,
        status: 'published',
        graph,
        builtin_revision: tree.revision,
        published_at: trx.fn.now(),
      });
    });
  }

  await upgradeUnmodified(knex, graph);
}

/** Publishes the current revision for every company still on an unmodified earlier one. */
async function upgradeUnmodified(knex: Knex, graph: string) {
  const tree = CURRENT_BUILTIN;
  const published: { id: string; tree_id: string; company_id: string; graph: unknown }[] = await knex('tree_versions as v')
    .join('fault_trees as t', 't.id', 'v.tree_id')
    .where({ 't.slug': tree.slug, 'v.status': 'published' })
    .select('v.id', 'v.tree_id', 'v.company_id', 'v.graph');
  for (const version of published) {
    const revision = unmodifiedRevisionOf(version.graph);
    if (revision === null || revision >= tree.revision) continue;
    await knex.transaction(async (trx) => {
      // Locked, so that two starts at once publish the revision once.
      const current = await trx('tree_versions').where({ id: version.id, status: 'published' }).forUpdate().first('id');
      if (!current) return;
      const { max } = (await trx('tree_versions').where({ tree_id: version.tree_id }).max('version as max').first()) as { max: number };
      await trx('tree_versions').where({ id: version.id }).update({ status: 'retired' });
      await trx('tree_versions').insert({
        company_id: version.company_id,
        tree_id: version.tree_id,
        version: Number(max) + 1,
        status: 'published',
        graph,
        builtin_revision: tree.revision,
        published_at: trx.fn.now(),
      });
    });
  }
}
