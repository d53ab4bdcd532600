import type { Knex } from 'knex';
import { DEFAULT_TREE } from '@/lib/trees/default-tree';
import { validateGraph } from '@/lib/trees/validate';

// Every company gets its own copy of the default tree as published version 1 (not demo data: a
// company needs a tree to diagnose with). Companies that already have it are left alone.
export async function seed(knex: Knex): Promise<void> {
  const checked = validateGraph(DEFAULT_TREE.graph);
  if (!checked.ok) {
    throw new Error(`The default tree does not validate:\n${checked.problems.map((p) => `- ${p.stepId ?? ''}: ${p.message}`).join('\n')}`);
  }
  const companies: { id: string }[] = await knex('companies')
    .whereNotExists(knex('fault_trees').whereRaw('fault_trees.company_id = companies.id').andWhere('slug', DEFAULT_TREE.slug))
    .select('id');
  for (const company of companies) {
    await knex.transaction(async (trx) => {
      const [tree] = await trx('fault_trees')
        .insert({
          company_id: company.id,
          slug: DEFAULT_TREE.slug,
          title: DEFAULT_TREE.title,
          symptom: DEFAULT_TREE.symptom,
          equipment_kind: DEFAULT_TREE.equipmentKind,
        })
        .returning('id');
      await trx('tree_versions').insert({
        company_id: company.id,
        tree_id: tree.id,
        version: 1,
        status: 'published',
        graph: JSON.stringify(checked.graph),
        published_at: trx.fn.now(),
      });
    });
  }
}
