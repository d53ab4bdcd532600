import 'server-only';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';

export type TreeVersionStatus = 'draft' | 'in_review' | 'published' | 'retired';

export interface TreeSummary {
  id: string;
  slug: string;
  title: string;
  symptom: string;
  equipmentKind: string;
  published: { id: string; version: number } | null;
}

export interface TreeVersionRecord {
  id: string;
  treeId: string;
  slug: string;
  title: string;
  version: number;
  status: TreeVersionStatus;
  graph: TreeGraph;
  publishedAt: Date | null;
  createdAt: Date;
}

export async function listTrees({ companyId }: { companyId: string }): Promise<TreeSummary[]> {
  const rows = await db('fault_trees as t')
    .leftJoin(
      db('tree_versions').where('status', 'published').select('tree_id').max('version as version').groupBy('tree_id').as('p'),
      'p.tree_id',
      't.id',
    )
    .leftJoin('tree_versions as v', function () {
      this.on('v.tree_id', 't.id').andOn('v.version', 'p.version');
    })
    .where('t.company_id', companyId)
    .orderBy('t.title')
    .select('t.id', 't.slug', 't.title', 't.symptom', 't.equipment_kind', 'v.id as version_id', 'v.version');
  return rows.map((r: Record<string, unknown>) => ({
    id: r.id as string,
    slug: r.slug as string,
    title: r.title as string,
    symptom: r.symptom as string,
    equipmentKind: r.equipment_kind as string,
    published: r.version_id ? { id: r.version_id as string, version: r.version as number } : null,
  }));
}

export async function getTreeVersion({ companyId, id }: { companyId: string; id: string }): Promise<TreeVersionRecord> {
  if (!isUuid(id)) throw notFound('That tree version');
  const row = await db('tree_versions as v')
    .join('fault_trees as t', 't.id', 'v.tree_id')
    .where({ 'v.id': id, 'v.company_id': companyId })
    .first('v.*', 't.slug', 't.title');
  if (!row) throw notFound('That tree version');
  return {
    id: row.id,
    treeId: row.tree_id,
    slug: row.slug,
    title: row.title,
    version: row.version,
    status: row.status,
    // Stored graphs were validated on save; parsing applies schema defaults to older rows too.
    graph: treeGraphSchema.parse(row.graph),
    publishedAt: row.published_at,
    createdAt: row.created_at,
  };
}
