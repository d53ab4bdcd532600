import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { AppError, notFound } from '@/lib/errors';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';

export const TREE_VERSION_STATUSES = ['draft', 'in_review', 'approved', 'published', 'retired'] as const;
export type TreeVersionStatus = (typeof TREE_VERSION_STATUSES)[number];

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
  /** Raised by every save of a draft; a save names the revision it was based on. */
  revision: number;
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
    .first(
      ...(cached ? ['v.id', 'v.tree_id', 'v.version', 'v.status', 'v.revision', 'v.published_at', 'v.created_at'] : ['v.*']),
      't.slug',
      't.title',
    );
  if (!row) throw notFound('That tree version');
  let graph = cached?.graph;
  if (!graph) {
    // A draft is saved with its problems, so its graph may not parse yet; it cannot be walked until it does.
    const parsed = treeGraphSchema.safeParse(row.graph);
    if (!parsed.success) throw new AppError('conflict', 'This draft has problems to fix before it can be used: see its validation.');
    graph = parsed.data;
  }
  const record: TreeVersionRecord = {
    id: row.id,
    treeId: row.tree_id,
    slug: row.slug,
    title: row.title,
    version: row.version,
    status: row.status,
    revision: row.revision,
    // Published graphs were validated on publishing; parsing applies schema defaults to older rows too.
    graph,
    publishedAt: row.published_at,
    createdAt: row.created_at,
  };
  if (record.status === 'published' || record.status === 'retired') {
    if (immutable.size >= MAX_CACHED) immutable.delete(immutable.keys().next().value!);
    immutable.set(id, { ...record, companyId });
  }
  return record;
}

// ── Authoring: drafts, review, publishing and the audit trail ───────────────────────────────────
// Every change of a version's state is one conditional UPDATE (… WHERE status = the expected one,
// and for a save also revision = the one it was based on): of two at once one lands, the other
// changes nothing and is told why by `explainMiss`.

export const TREE_EVENT_KINDS = [
  'created',
  'draft-started',
  'edited',
  'submitted',
  'approved',
  'returned',
  'published',
  'retired',
  'imported',
] as const;
export type TreeEventKind = (typeof TREE_EVENT_KINDS)[number];

export interface ReviewComment {
  stepId?: string;
  text: string;
}

export interface PersonRef {
  id: string;
  name: string;
}

/** A version as authoring sees it: the graph as stored (a draft's may not pass the schema yet). */
export interface AuthoringVersion {
  id: string;
  treeId: string;
  slug: string;
  title: string;
  symptom: string;
  equipmentKind: string;
  version: number;
  status: TreeVersionStatus;
  revision: number;
  graph: unknown;
  builtinRevision: number | null;
  fromBuiltinRevision: number | null;
  basedOnId: string | null;
  author: PersonRef | null;
  updatedBy: PersonRef | null;
  updatedAt: Date;
  submittedBy: PersonRef | null;
  submittedAt: Date | null;
  approvedBy: PersonRef | null;
  approvedAt: Date | null;
  publishedBy: PersonRef | null;
  publishedAt: Date | null;
  returnedBy: PersonRef | null;
  returnedAt: Date | null;
  reviewComments: ReviewComment[];
  createdAt: Date;
}

const PEOPLE = ['author_id', 'updated_by', 'submitted_by', 'approved_by', 'published_by', 'returned_by'] as const;

function authoringQuery(trx: Knex) {
  const q = trx('tree_versions as v').join('fault_trees as t', 't.id', 'v.tree_id');
  for (const column of PEOPLE) q.leftJoin(`users as u_${column}`, `u_${column}.id`, `v.${column}`);
  return q.select(
    'v.*',
    't.slug',
    't.title',
    't.symptom',
    't.equipment_kind',
    ...PEOPLE.map((column) => `u_${column}.name as ${column}_name`),
  );
}

function person(row: Record<string, unknown>, column: (typeof PEOPLE)[number]): PersonRef | null {
  return row[column] ? { id: row[column] as string, name: (row[`${column}_name`] as string | null) ?? 'A former user' } : null;
}

function toAuthoring(row: Record<string, unknown>): AuthoringVersion {
  return {
    id: row.id as string,
    treeId: row.tree_id as string,
    slug: row.slug as string,
    title: row.title as string,
    symptom: row.symptom as string,
    equipmentKind: row.equipment_kind as string,
    version: row.version as number,
    status: row.status as TreeVersionStatus,
    revision: row.revision as number,
    graph: row.graph,
    builtinRevision: (row.builtin_revision as number | null) ?? null,
    fromBuiltinRevision: (row.from_builtin_revision as number | null) ?? null,
    basedOnId: (row.based_on_id as string | null) ?? null,
    author: person(row, 'author_id'),
    updatedBy: person(row, 'updated_by'),
    updatedAt: row.updated_at as Date,
    submittedBy: person(row, 'submitted_by'),
    submittedAt: (row.submitted_at as Date | null) ?? null,
    approvedBy: person(row, 'approved_by'),
    approvedAt: (row.approved_at as Date | null) ?? null,
    publishedBy: person(row, 'published_by'),
    publishedAt: (row.published_at as Date | null) ?? null,
    returnedBy: person(row, 'returned_by'),
    returnedAt: (row.returned_at as Date | null) ?? null,
    reviewComments: (row.review_comments as ReviewComment[] | null) ?? [],
    createdAt: row.created_at as Date,
  };
}

export async function getAuthoringVersion(
  { companyId, id, lock = false }: { companyId: string; id: string; lock?: boolean },
  trx: Knex = db,
): Promise<AuthoringVersion> {
  if (!isUuid(id)) throw notFound('That tree version');
  const q = authoringQuery(trx).where({ 'v.id': id, 'v.company_id': companyId });
  if (lock) q.forUpdate('v');
  const row = await q.first();
  if (!row) throw notFound('That tree version');
  return toAuthoring(row);
}

/** Every version of a tree, newest first. */
export async function listTreeVersions(
  { companyId, treeId }: { companyId: string; treeId: string },
  trx: Knex = db,
): Promise<AuthoringVersion[]> {
  if (!isUuid(treeId)) throw notFound('That tree');
  const rows = await authoringQuery(trx).where({ 'v.tree_id': treeId, 'v.company_id': companyId }).orderBy('v.version', 'desc');
  return rows.map(toAuthoring);
}

export interface TreeRecord {
  id: string;
  slug: string;
  title: string;
  symptom: string;
  equipmentKind: string;
  createdAt: Date;
}

export async function getTree(
  { companyId, id, lock = false }: { companyId: string; id: string; lock?: boolean },
  trx: Knex = db,
): Promise<TreeRecord> {
  if (!isUuid(id)) throw notFound('That tree');
  const q = trx('fault_trees').where({ id, company_id: companyId });
  if (lock) q.forUpdate();
  const row = await q.first();
  if (!row) throw notFound('That tree');
  return {
    id: row.id,
    slug: row.slug,
    title: row.title,
    symptom: row.symptom,
    equipmentKind: row.equipment_kind,
    createdAt: row.created_at,
  };
}

export async function findTreeBySlug({ companyId, slug }: { companyId: string; slug: string }, trx: Knex = db): Promise<TreeRecord | null> {
  const row = await trx('fault_trees').where({ company_id: companyId, slug }).first();
  return row
    ? { id: row.id, slug: row.slug, title: row.title, symptom: row.symptom, equipmentKind: row.equipment_kind, createdAt: row.created_at }
    : null;
}

export async function insertTree(
  input: { companyId: string; slug: string; title: string; symptom: string; equipmentKind: string },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('fault_trees')
    .insert({
      company_id: input.companyId,
      slug: input.slug,
      title: input.title,
      symptom: input.symptom,
      equipment_kind: input.equipmentKind,
    })
    .onConflict(['company_id', 'slug'])
    .ignore()
    .returning('id');
  if (!row)
    throw new AppError('conflict', `A tree with the short name "${input.slug}" exists already: choose another.`, {
      fieldErrors: { slug: ['Taken by another tree.'] },
    });
  return row.id;
}

/** A new draft as the tree's next version number (of two at once, the second gets the next number). */
export async function insertDraft(
  input: {
    companyId: string;
    treeId: string;
    userId: string;
    graph: unknown;
    basedOnId?: string | null;
    fromBuiltinRevision?: number | null;
  },
  trx: Knex = db,
): Promise<{ id: string; version: number; revision: number }> {
  // The tree row is locked so the next number is taken once.
  await trx('fault_trees').where({ id: input.treeId, company_id: input.companyId }).forUpdate().first('id');
  const { max } = (await trx('tree_versions').where({ tree_id: input.treeId }).max('version as max').first()) as { max: number | null };
  const [row] = await trx('tree_versions')
    .insert({
      company_id: input.companyId,
      tree_id: input.treeId,
      version: Number(max ?? 0) + 1,
      status: 'draft',
      graph: JSON.stringify(input.graph),
      author_id: input.userId,
      updated_by: input.userId,
      based_on_id: input.basedOnId ?? null,
      from_builtin_revision: input.fromBuiltinRevision ?? null,
    })
    .returning(['id', 'version', 'revision']);
  return { id: row.id, version: row.version, revision: row.revision };
}

/** Stores a draft's graph if it is still a draft at `baseRevision`; null when it was not (see `explainMiss`). */
export async function updateDraftGraph(
  { companyId, id, userId, baseRevision, graph }: { companyId: string; id: string; userId: string; baseRevision: number; graph: unknown },
  trx: Knex = db,
): Promise<{ revision: number; updatedAt: Date } | null> {
  if (!isUuid(id)) throw notFound('That tree version');
  const [row] = await trx('tree_versions')
    .where({ id, company_id: companyId, status: 'draft', revision: baseRevision })
    .update({ graph: JSON.stringify(graph), revision: trx.raw('revision + 1'), updated_by: userId, updated_at: trx.fn.now() })
    .returning(['revision', 'updated_at']);
  return row ? { revision: row.revision, updatedAt: row.updated_at } : null;
}

/** Moves a version from one status to another if it is still in `from` (and at `revision`, when given). */
export async function moveVersion(
  {
    companyId,
    id,
    from,
    to,
    revision,
    set = {},
    notBy,
  }: {
    companyId: string;
    id: string;
    from: TreeVersionStatus;
    to: TreeVersionStatus;
    revision?: number;
    set?: Record<string, unknown>;
    /** Refused (no row moves) when this user authored, edited or submitted the version. */
    notBy?: string;
  },
  trx: Knex = db,
): Promise<boolean> {
  if (!isUuid(id)) throw notFound('That tree version');
  const q = trx('tree_versions').where({ id, company_id: companyId, status: from });
  if (revision !== undefined) q.andWhere('revision', revision);
  if (notBy) {
    q.andWhere((w) => w.whereNull('author_id').orWhereNot('author_id', notBy))
      .andWhere((w) => w.whereNull('submitted_by').orWhereNot('submitted_by', notBy))
      .whereNotExists(
        trx('tree_events')
          .whereRaw('tree_events.version_id = tree_versions.id')
          .andWhere({ user_id: notBy })
          .whereIn('kind', ['edited', 'draft-started', 'imported']),
      );
  }
  const rows = await q.update({ status: to, ...set }).returning('id');
  return rows.length === 1;
}

/** Retires the tree's published version, if any (publishing another). */
export async function retirePublished(
  { companyId, treeId }: { companyId: string; treeId: string },
  trx: Knex = db,
): Promise<string | null> {
  const [row] = await trx('tree_versions')
    .where({ tree_id: treeId, company_id: companyId, status: 'published' })
    .update({ status: 'retired' })
    .returning('id');
  return row?.id ?? null;
}

export interface TreeEvent {
  id: string;
  versionId: string | null;
  version: number | null;
  kind: TreeEventKind;
  user: PersonRef | null;
  detail: Record<string, unknown>;
  at: Date;
}

// Autosave writes often: edits by the same person to the same version within this window are one
// event (its revision and time moved on), so the trail says who edited, not every keystroke.
const EDIT_WINDOW_MINUTES = 15;

export async function recordTreeEvent(
  input: {
    companyId: string;
    treeId: string;
    versionId: string | null;
    userId: string | null;
    kind: TreeEventKind;
    detail?: Record<string, unknown>;
  },
  trx: Knex = db,
): Promise<void> {
  if (input.kind === 'edited' && input.versionId) {
    const moved = await trx('tree_events')
      .where({ company_id: input.companyId, version_id: input.versionId, user_id: input.userId, kind: 'edited' })
      .andWhere('at', '>', trx.raw(`now() - interval '${EDIT_WINDOW_MINUTES} minutes'`))
      .whereNotExists(
        trx('tree_events as later').whereRaw('later.version_id = tree_events.version_id').andWhereRaw('later.id > tree_events.id'),
      )
      .update({ at: trx.fn.now(), detail: JSON.stringify(input.detail ?? {}) })
      .returning('id');
    if (moved.length > 0) return;
  }
  await trx('tree_events').insert({
    company_id: input.companyId,
    tree_id: input.treeId,
    version_id: input.versionId,
    user_id: input.userId,
    kind: input.kind,
    detail: JSON.stringify(input.detail ?? {}),
  });
}

export async function listTreeEvents(
  { companyId, treeId, limit = 200 }: { companyId: string; treeId: string; limit?: number },
  trx: Knex = db,
): Promise<TreeEvent[]> {
  const rows = await trx('tree_events as e')
    .leftJoin('users as u', 'u.id', 'e.user_id')
    .leftJoin('tree_versions as v', 'v.id', 'e.version_id')
    .where({ 'e.company_id': companyId, 'e.tree_id': treeId })
    .orderBy([
      { column: 'e.at', order: 'desc' },
      { column: 'e.id', order: 'desc' },
    ])
    .limit(limit)
    .select('e.id', 'e.version_id', 'v.version', 'e.kind', 'e.user_id', 'u.name as user_name', 'e.detail', 'e.at');
  return rows.map((r: Record<string, unknown>) => ({
    id: String(r.id),
    versionId: (r.version_id as string | null) ?? null,
    version: (r.version as number | null) ?? null,
    kind: r.kind as TreeEventKind,
    user: r.user_id ? { id: r.user_id as string, name: (r.user_name as string | null) ?? 'A former user' } : null,
    detail: (r.detail as Record<string, unknown>) ?? {},
    at: r.at as Date,
  }));
}

export interface AuthoringTreeRow extends TreeRecord {
  published: { id: string; version: number; builtinRevision: number | null; graph: unknown; publishedAt: Date | null } | null;
  openVersions: {
    id: string;
    version: number;
    status: TreeVersionStatus;
    revision: number;
    updatedBy: PersonRef | null;
    updatedAt: Date;
    author: PersonRef | null;
  }[];
  lastEvent: { kind: TreeEventKind; user: PersonRef | null; at: Date } | null;
  /** The highest built-in revision any version of the tree is, or was started from. */
  builtinSeen: number | null;
}

/** Every tree of the company with what the list shows: published version, open drafts and reviews, last change. */
export async function listAuthoringTrees({ companyId }: { companyId: string }, trx: Knex = db): Promise<AuthoringTreeRow[]> {
  const trees = await trx('fault_trees').where({ company_id: companyId }).orderBy('title').select('*');
  if (trees.length === 0) return [];
  const versions = await trx('tree_versions as v')
    .leftJoin('users as ua', 'ua.id', 'v.author_id')
    .leftJoin('users as uu', 'uu.id', 'v.updated_by')
    .where('v.company_id', companyId)
    .whereNot('v.status', 'retired')
    .orderBy('v.version', 'desc')
    .select(
      'v.id',
      'v.tree_id',
      'v.version',
      'v.status',
      'v.revision',
      'v.builtin_revision',
      'v.graph',
      'v.published_at',
      'v.updated_at',
      'v.author_id',
      'ua.name as author_name',
      'v.updated_by',
      'uu.name as updated_name',
    );
  const seen = await trx('tree_versions')
    .where('company_id', companyId)
    .groupBy('tree_id')
    .select('tree_id', trx.raw('max(greatest(coalesce(builtin_revision, 0), coalesce(from_builtin_revision, 0))) as seen'));
  const last = await trx
    .select('e.tree_id', 'e.kind', 'e.at', 'e.user_id', 'u.name as user_name')
    .from(
      trx('tree_events')
        .where('company_id', companyId)
        .distinctOn('tree_id')
        .orderBy([{ column: 'tree_id' }, { column: 'at', order: 'desc' }, { column: 'id', order: 'desc' }])
        .select('*')
        .as('e'),
    )
    .leftJoin('users as u', 'u.id', 'e.user_id');
  const seenBy = new Map(seen.map((r: { tree_id: string; seen: number }) => [r.tree_id, Number(r.seen) || null]));
  const lastBy = new Map(last.map((r: Record<string, unknown>) => [r.tree_id as string, r]));
  return trees.map((t: Record<string, unknown>) => {
    const mine = versions.filter((v: Record<string, unknown>) => v.tree_id === t.id);
    const published = mine.find((v: Record<string, unknown>) => v.status === 'published');
    const e = lastBy.get(t.id as string);
    return {
      id: t.id as string,
      slug: t.slug as string,
      title: t.title as string,
      symptom: t.symptom as string,
      equipmentKind: t.equipment_kind as string,
      createdAt: t.created_at as Date,
      published: published
        ? {
            id: published.id,
            version: published.version,
            builtinRevision: published.builtin_revision ?? null,
            graph: published.graph,
            publishedAt: published.published_at ?? null,
          }
        : null,
      openVersions: mine
        .filter((v: Record<string, unknown>) => v.status !== 'published')
        .map((v: Record<string, unknown>) => ({
          id: v.id as string,
          version: v.version as number,
          status: v.status as TreeVersionStatus,
          revision: v.revision as number,
          updatedBy: v.updated_by ? { id: v.updated_by as string, name: (v.updated_name as string | null) ?? 'A former user' } : null,
          updatedAt: v.updated_at as Date,
          author: v.author_id ? { id: v.author_id as string, name: (v.author_name as string | null) ?? 'A former user' } : null,
        })),
      lastEvent: e
        ? {
            kind: e.kind as TreeEventKind,
            at: e.at as Date,
            user: e.user_id ? { id: e.user_id as string, name: (e.user_name as string | null) ?? 'A former user' } : null,
          }
        : null,
      builtinSeen: seenBy.get(t.id as string) ?? null,
    };
  });
}

/** Versions waiting for a review (submitted) or for publishing (approved) that `userId` may act on: not their own. */
export async function listWaitingReviews({ companyId, userId }: { companyId: string; userId: string }, trx: Knex = db) {
  const rows = await trx('tree_versions as v')
    .join('fault_trees as t', 't.id', 'v.tree_id')
    .leftJoin('users as u', 'u.id', 'v.submitted_by')
    .where('v.company_id', companyId)
    .whereIn('v.status', ['in_review', 'approved'])
    .andWhere((w) => w.whereNull('v.author_id').orWhereNot('v.author_id', userId))
    .orderBy('v.submitted_at')
    .select('v.id', 'v.tree_id', 't.title', 'v.version', 'v.status', 'v.submitted_at', 'u.name as submitted_by_name');
  return rows.map((r: Record<string, unknown>) => ({
    id: r.id as string,
    treeId: r.tree_id as string,
    title: r.title as string,
    version: r.version as number,
    status: r.status as TreeVersionStatus,
    submittedAt: (r.submitted_at as Date | null) ?? null,
    submittedBy: (r.submitted_by_name as string | null) ?? null,
  }));
}
