import 'server-only';
import type { Knex } from 'knex';
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

export async function listTrees({ companyId }: { companyId: string }, trx: Knex = db): Promise<TreeSummary[]> {
  const rows = await trx('fault_trees as t')
    .leftJoin(
      trx('tree_versions').where('status', 'published').select('tree_id').max('version as version').groupBy('tree_id').as('p'),
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

// A published (or retired) version never changes (a trigger enforces it), so its parsed graph is
// kept for the life of the process: a save neither reads nor parses the graph again, and the
// machine compiled from it (machines/diagnosis-machine.ts, keyed by version id) is reused.
const immutable = new Map<string, TreeVersionRecord & { companyId: string }>();
const MAX_CACHED = 500;

/**
 * One version of the company's trees. A cached immutable version may show an old status (publishing
 * later retires it): pass `fresh` where the status decides something, such as starting a diagnosis.
 */
export async function getTreeVersion(
  { companyId, id, fresh = false }: { companyId: string; id: string; fresh?: boolean },
  trx: Knex = db,
): Promise<TreeVersionRecord> {
  if (!isUuid(id)) throw notFound('That tree version');
  const cached = immutable.get(id);
  if (cached && cached.companyId !== companyId) throw notFound('That tree version');
  if (cached && !fresh) return cached;
  // With the graph cached, only the small columns are read.
  const row = await trx('tree_versions as v')
    .join('fault_trees as t', 't.id', 'v.tree_id')
    .where({ 'v.id': id, 'v.company_id': companyId })
    .first(...(cached ? ['v.id', 'v.tree_id', 'v.version', 'v.status', 'v.published_at', 'v.created_at'] : ['v.*']), 't.slug', 't.title');
  if (!row) throw notFound('That tree version');
  const record: TreeVersionRecord = {
    id: row.id,
    treeId: row.tree_id,
    slug: row.slug,
    title: row.title,
    version: row.version,
    status: row.status,
    // Stored graphs were validated on save; parsing applies schema defaults to older rows too.
    graph: cached?.graph ?? treeGraphSchema.parse(row.graph),
    publishedAt: row.published_at,
    createdAt: row.created_at,
  };
  if (record.status === 'published' || record.status === 'retired') {
    if (immutable.size >= MAX_CACHED) immutable.delete(immutable.keys().next().value!);
    immutable.set(id, { ...record, companyId });
  }
  return record;
}
