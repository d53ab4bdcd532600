import 'server-only';
import { db } from '@/db/knex';
import {
  findTreeBySlug,
  getAuthoringVersion,
  getTree,
  getTreeVersion,
  insertDraft,
  insertTree,
  listAuthoringTrees,
  listTreeEvents,
  listTreeVersions,
  listWaitingReviews,
  moveVersion,
  recordTreeEvent,
  retirePublished,
  updateDraftGraph,
  type AuthoringVersion,
  type ReviewComment,
} from '@/db/trees';
import { AppError, notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { Role } from '@/lib/roles';
import { notify } from '@/lib/server/notify';
import { toApiStep } from '@/lib/server/steps';
import { CURRENT_BUILTIN } from '@/lib/trees/builtin';
import { diffGraphs } from '@/lib/trees/diff';
import { exportTreeDocument, readTreeDocument } from '@/lib/trees/document';
import { treeGraphSchema } from '@/lib/trees/schema';
import { validateGraph, type GraphProblem } from '@/lib/trees/validate';
import { waitingReviewListSchema, type DraftGraph } from '@/lib/validations/trees';

// Tree authoring: leads (and admins) create trees, start drafts, save them (each save names the
// revision it was based on), submit them, and a *different* lead or an admin approves; publishing
// runs the validator here, on the server, and retires the version before. Every change of state is
// a conditional update (db/trees.ts): of two at once one lands and the other gets a 409.

/** Who reads what: everyone signed in reads published (and retired) versions; drafts and reviews are for leads and admins. */
const AUTHORS: readonly Role[] = ['lead', 'admin'];
const mayReadDrafts = (role: Role) => AUTHORS.includes(role);
const isOpen = (status: string) => status === 'draft' || status === 'in_review' || status === 'approved';

/** A draft from scratch: one step to start from; the validator says what it still needs. */
export function scratchGraph(): DraftGraph {
  return {
    start: 'first-step',
    steps: [
      {
        id: 'first-step',
        kind: 'inspect',
        title: 'First step',
        instruction: '',
        energy: { electric: 'any', gas: 'any' },
        choices: [],
      },
    ],
  };
}

export function problemsOf(graph: unknown): GraphProblem[] {
  const result = validateGraph(graph);
  return result.ok ? [] : result.problems;
}

/**
 * A refusal for the tree's content (422, the problems by step id in `fieldErrors`), as opposed to a
 * version in the wrong status or at another revision (409): the lead fixes the tree, not the timing.
 */
function refuseWithProblems(what: string, problems: GraphProblem[]): AppError {
  const fieldErrors: Record<string, string[]> = {};
  for (const p of problems) (fieldErrors[p.stepId ?? '_form'] ??= []).push(p.message);
  return new AppError(
    'unprocessable',
    `${what}: the tree has ${problems.length} problem${problems.length === 1 ? '' : 's'} to fix first.`,
    {
      fieldErrors,
    },
  );
}

function slugOf(title: string): string {
  const slug = title
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 50);
  return slug || 'tree';
}

const storedGraph = (graph: unknown) => graph as DraftGraph;

function authoringOut(v: AuthoringVersion) {
  return { ...v, graph: storedGraph(v.graph), problems: problemsOf(v.graph) };
}

// ── Reads ───────────────────────────────────────────────────────────────────────────────────────

/** GET /api/tree-versions/{id}: a published version for anyone signed in; a draft or review only for leads and admins. */
export async function readTreeVersion({ scope, role, id }: { scope: Scope; role: Role; id: string }) {
  const v = await getTreeVersion({ companyId: scope.companyId, id, fresh: true }).catch((error) => {
    // A draft that does not parse yet is still a draft: for others it is simply not there.
    if (error instanceof AppError && error.code === 'conflict' && !mayReadDrafts(role)) throw notFound('That tree version');
    throw error;
  });
  if (isOpen(v.status) && !mayReadDrafts(role)) throw notFound('That tree version');
  return { ...v, graph: { start: v.graph.start, steps: v.graph.steps.map(toApiStep) } };
}

/** A version for the editor or a review: the graph as stored, its problems, who did what. */
export async function getVersionForAuthoring({ scope, id }: { scope: Scope; id: string }) {
  return authoringOut(await getAuthoringVersion({ companyId: scope.companyId, id }));
}

/** The built-in update a tree is offered: the product ships a revision newer than any this tree is or started from. */
export function builtinUpdateOf(tree: { slug: string; published: { id: string } | null; builtinSeen: number | null }) {
  if (tree.slug !== CURRENT_BUILTIN.slug || !tree.published) return null;
  if ((tree.builtinSeen ?? 0) >= CURRENT_BUILTIN.revision) return null;
  return { revision: CURRENT_BUILTIN.revision, title: CURRENT_BUILTIN.title, publishedVersionId: tree.published.id };
}

export async function listTreesForAuthoring({ scope }: { scope: Scope }) {
  const trees = await listAuthoringTrees({ companyId: scope.companyId });
  return trees.map((t) => ({
    ...t,
    published: t.published ? { id: t.published.id, version: t.published.version, publishedAt: t.published.publishedAt } : null,
    lastChange: t.lastEvent,
    builtinUpdate: builtinUpdateOf(t),
  }));
}

export async function getTreeForAuthoring({ scope, treeId }: { scope: Scope; treeId: string }) {
  const tree = await getTree({ companyId: scope.companyId, id: treeId });
  const [versions, events] = await Promise.all([
    listTreeVersions({ companyId: scope.companyId, treeId }),
    listTreeEvents({ companyId: scope.companyId, treeId }),
  ]);
  const published = versions.find((v) => v.status === 'published') ?? null;
  const builtinSeen = Math.max(0, ...versions.map((v) => Math.max(v.builtinRevision ?? 0, v.fromBuiltinRevision ?? 0)));
  return {
    ...tree,
    versions: versions.map(({ graph: _graph, ...v }) => v),
    events,
    builtinUpdate: builtinUpdateOf({ slug: tree.slug, published, builtinSeen }),
  };
}

/** A lead's home: the versions waiting for their review (submitted by someone else) or for publishing. */
export async function listReviewsWaiting({ scope }: { scope: Scope }) {
  return waitingReviewListSchema.parse(await listWaitingReviews({ companyId: scope.companyId, userId: scope.userId }));
}

export async function validateVersion({ scope, id }: { scope: Scope; id: string }) {
  const v = await getAuthoringVersion({ companyId: scope.companyId, id });
  const problems = problemsOf(v.graph);
  return { id: v.id, revision: v.revision, ok: problems.length === 0, problems };
}

const labelOf = (v: { version: number; status: string }) => `Version ${v.version} (${v.status.replace('_', ' ')})`;

/** GET /api/tree-versions/{id}/diff?against={otherId|builtin}: from the other version to this one. */
export async function diffVersions({ scope, id, against }: { scope: Scope; id: string; against: string }) {
  const v = await getAuthoringVersion({ companyId: scope.companyId, id });
  if (against === 'builtin') {
    const builtin = treeGraphSchema.parse(CURRENT_BUILTIN.graph);
    return {
      from: { id: v.id, label: labelOf(v) },
      to: { id: 'builtin', label: `Built-in revision ${CURRENT_BUILTIN.revision}` },
      ...diffGraphs(v.graph, builtin),
    };
  }
  const other = await getAuthoringVersion({ companyId: scope.companyId, id: against });
  if (other.treeId !== v.treeId) {
    throw new AppError('bad_request', 'Compare two versions of the same tree.', {
      fieldErrors: { against: ['Not a version of this tree.'] },
    });
  }
  return { from: { id: other.id, label: labelOf(other) }, to: { id: v.id, label: labelOf(v) }, ...diffGraphs(other.graph, v.graph) };
}

export async function exportVersion({ scope, id }: { scope: Scope; id: string }) {
  const v = await getAuthoringVersion({ companyId: scope.companyId, id });
  const parsed = validateGraph(v.graph);
  if (!parsed.ok) throw refuseWithProblems('This version cannot be exported', parsed.problems);
  return exportTreeDocument({
    tree: { slug: v.slug, title: v.title, symptom: v.symptom, equipmentKind: v.equipmentKind },
    version: v.version,
    graph: parsed.graph,
    exportedAt: new Date(),
  });
}

// ── Changes ─────────────────────────────────────────────────────────────────────────────────────

export async function createTree({
  scope,
  input,
}: {
  scope: Scope;
  input: { title: string; symptom: string; equipmentKind: string; slug?: string };
}) {
  return db.transaction(async (trx) => {
    const slug = input.slug ?? slugOf(input.title);
    const treeId = await insertTree(
      { companyId: scope.companyId, slug, title: input.title, symptom: input.symptom, equipmentKind: input.equipmentKind },
      trx,
    );
    const draft = await insertDraft({ companyId: scope.companyId, treeId, userId: scope.userId, graph: scratchGraph() }, trx);
    await recordTreeEvent({ companyId: scope.companyId, treeId, versionId: draft.id, userId: scope.userId, kind: 'created' }, trx);
    return { treeId, ...draft, status: 'draft' as const };
  });
}

export async function startDraft({
  scope,
  treeId,
  fromVersionId,
  fromBuiltin,
}: {
  scope: Scope;
  treeId: string;
  fromVersionId?: string;
  fromBuiltin?: boolean;
}) {
  return db.transaction(async (trx) => {
    const tree = await getTree({ companyId: scope.companyId, id: treeId }, trx);
    let graph: unknown = scratchGraph();
    let basedOnId: string | null = null;
    let fromBuiltinRevision: number | null = null;
    if (fromVersionId) {
      const from = await getAuthoringVersion({ companyId: scope.companyId, id: fromVersionId }, trx);
      if (from.treeId !== tree.id) {
        throw new AppError('bad_request', 'Copy a version of this tree.', {
          fieldErrors: { fromVersionId: ['Not a version of this tree.'] },
        });
      }
      graph = from.graph;
      basedOnId = from.id;
    } else if (fromBuiltin) {
      if (tree.slug !== CURRENT_BUILTIN.slug) {
        throw new AppError('bad_request', 'Only the built-in tree has a built-in revision to start from.', {
          fieldErrors: { fromBuiltin: ['This tree is not the built-in one.'] },
        });
      }
      graph = treeGraphSchema.parse(CURRENT_BUILTIN.graph);
      fromBuiltinRevision = CURRENT_BUILTIN.revision;
    }
    const draft = await insertDraft(
      { companyId: scope.companyId, treeId, userId: scope.userId, graph, basedOnId, fromBuiltinRevision },
      trx,
    );
    await recordTreeEvent(
      {
        companyId: scope.companyId,
        treeId,
        versionId: draft.id,
        userId: scope.userId,
        kind: 'draft-started',
        detail: { from: fromVersionId ?? (fromBuiltin ? `builtin-r${CURRENT_BUILTIN.revision}` : 'scratch') },
      },
      trx,
    );
    return { treeId, ...draft, status: 'draft' as const };
  });
}

/** Why a conditional update moved nothing: the row is gone, not in the expected status, or at another revision. */
async function explainMiss(scope: Scope, id: string, expected: { status: string; action: string }) {
  const v = await getAuthoringVersion({ companyId: scope.companyId, id });
  if (v.status !== expected.status) {
    return new AppError('conflict', `This version is ${v.status.replace('_', ' ')} now, so it cannot be ${expected.action}.`);
  }
  return new AppError('conflict', 'Someone changed this version at the same moment. Reload it and try again.');
}

export async function saveDraft({ scope, id, baseRevision, graph }: { scope: Scope; id: string; baseRevision: number; graph: DraftGraph }) {
  return db.transaction(async (trx) => {
    const saved = await updateDraftGraph({ companyId: scope.companyId, id, userId: scope.userId, baseRevision, graph }, trx);
    if (!saved) {
      const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
      if (v.status !== 'draft') {
        throw new AppError(
          'conflict',
          `This version is ${v.status.replace('_', ' ')}: only a draft can be edited. Start a new draft from it.`,
        );
      }
      return {
        outcome: 'stale' as const,
        id,
        message: `Someone saved this draft since revision ${baseRevision} (it is at revision ${v.revision} now). Nothing of yours was stored: compare both, merge, and save again.`,
        current: { revision: v.revision, graph: storedGraph(v.graph), updatedBy: v.updatedBy, updatedAt: v.updatedAt },
      };
    }
    const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    await recordTreeEvent(
      {
        companyId: scope.companyId,
        treeId: v.treeId,
        versionId: id,
        userId: scope.userId,
        kind: 'edited',
        detail: { revision: saved.revision },
      },
      trx,
    );
    return {
      outcome: 'saved' as const,
      id,
      status: 'draft' as const,
      revision: saved.revision,
      updatedAt: saved.updatedAt,
      problems: problemsOf(graph),
    };
  });
}

export async function submitVersion({ scope, id, revision, who }: { scope: Scope; id: string; revision?: number; who: string }) {
  const result = await db.transaction(async (trx) => {
    const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    if (v.status !== 'draft')
      throw new AppError('conflict', `This version is ${v.status.replace('_', ' ')}: only a draft can be submitted.`);
    if (revision !== undefined && revision !== v.revision) {
      throw new AppError(
        'conflict',
        `The draft was saved again since revision ${revision}: look at revision ${v.revision} before submitting it.`,
      );
    }
    const problems = problemsOf(v.graph);
    if (problems.length > 0) throw refuseWithProblems('This draft cannot be submitted', problems);
    const moved = await moveVersion(
      {
        companyId: scope.companyId,
        id,
        from: 'draft',
        to: 'in_review',
        revision: v.revision,
        set: { submitted_by: scope.userId, submitted_at: trx.fn.now(), review_comments: JSON.stringify([]) },
      },
      trx,
    );
    if (!moved) throw await explainMiss(scope, id, { status: 'draft', action: 'submitted' });
    await recordTreeEvent(
      {
        companyId: scope.companyId,
        treeId: v.treeId,
        versionId: id,
        userId: scope.userId,
        kind: 'submitted',
        detail: { revision: v.revision },
      },
      trx,
    );
    return { v, out: { id, treeId: v.treeId, status: 'in_review' as const, revision: v.revision } };
  });
  await notify({
    kind: 'tree-review',
    companyId: scope.companyId,
    actorId: scope.userId,
    versionId: id,
    who,
    treeTitle: result.v.title,
    version: result.v.version,
  });
  return result.out;
}

export async function approveVersion({ scope, id }: { scope: Scope; id: string }) {
  return db.transaction(async (trx) => {
    const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    if (v.status !== 'in_review')
      throw new AppError('conflict', `This version is ${v.status.replace('_', ' ')}: only a submitted version can be approved.`);
    const moved = await moveVersion(
      {
        companyId: scope.companyId,
        id,
        from: 'in_review',
        to: 'approved',
        notBy: scope.userId,
        set: { approved_by: scope.userId, approved_at: trx.fn.now() },
      },
      trx,
    );
    if (!moved) {
      const now = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
      if (now.status === 'in_review') {
        throw new AppError('forbidden', 'You wrote or edited this version: a different lead (or an admin) must approve it.');
      }
      throw await explainMiss(scope, id, { status: 'in_review', action: 'approved' });
    }
    await recordTreeEvent({ companyId: scope.companyId, treeId: v.treeId, versionId: id, userId: scope.userId, kind: 'approved' }, trx);
    return { id, treeId: v.treeId, status: 'approved' as const, revision: v.revision };
  });
}

export async function returnVersion({ scope, id, comments }: { scope: Scope; id: string; comments: ReviewComment[] }) {
  return db.transaction(async (trx) => {
    const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    if (v.status !== 'in_review' && v.status !== 'approved') {
      throw new AppError('conflict', `This version is ${v.status.replace('_', ' ')}: only a version in review can be sent back.`);
    }
    const moved = await moveVersion(
      {
        companyId: scope.companyId,
        id,
        from: v.status,
        to: 'draft',
        set: {
          returned_by: scope.userId,
          returned_at: trx.fn.now(),
          review_comments: JSON.stringify(comments),
          approved_by: null,
          approved_at: null,
        },
      },
      trx,
    );
    if (!moved) throw await explainMiss(scope, id, { status: v.status, action: 'sent back' });
    await recordTreeEvent(
      { companyId: scope.companyId, treeId: v.treeId, versionId: id, userId: scope.userId, kind: 'returned', detail: { comments } },
      trx,
    );
    return { id, treeId: v.treeId, status: 'draft' as const, revision: v.revision };
  });
}

/** Publishes an approved version after the validator, on the server, finds nothing; the version before is retired. */
export async function publishVersion({ scope, id }: { scope: Scope; id: string }) {
  return db.transaction(async (trx) => {
    const first = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    // The tree row first: two publishes of one tree queue here, and the second finds the first done.
    await getTree({ companyId: scope.companyId, id: first.treeId, lock: true }, trx);
    const v = await getAuthoringVersion({ companyId: scope.companyId, id }, trx);
    if (v.status !== 'approved') {
      throw new AppError(
        'conflict',
        v.status === 'published'
          ? 'This version is published already.'
          : `This version is ${v.status.replace('_', ' ')}: it must be approved before it is published.`,
      );
    }
    const checked = validateGraph(v.graph);
    if (!checked.ok) throw refuseWithProblems('This version cannot be published', checked.problems);
    const retiredId = await retirePublished({ companyId: scope.companyId, treeId: v.treeId }, trx);
    const moved = await moveVersion(
      {
        companyId: scope.companyId,
        id,
        from: 'approved',
        to: 'published',
        set: { published_by: scope.userId, published_at: trx.fn.now() },
      },
      trx,
    );
    if (!moved) throw await explainMiss(scope, id, { status: 'approved', action: 'published' });
    if (retiredId) {
      await recordTreeEvent(
        { companyId: scope.companyId, treeId: v.treeId, versionId: retiredId, userId: scope.userId, kind: 'retired', detail: { by: id } },
        trx,
      );
    }
    await recordTreeEvent({ companyId: scope.companyId, treeId: v.treeId, versionId: id, userId: scope.userId, kind: 'published' }, trx);
    return { id, treeId: v.treeId, status: 'published' as const, revision: v.revision, retiredId };
  });
}

/** POST /api/trees/import: the document is read whole first; on any problem nothing is stored and every problem is listed with its path. */
export async function importTree({ scope, document }: { scope: Scope; document: unknown }) {
  const reading = readTreeDocument(document);
  if (!reading.ok) {
    const fieldErrors: Record<string, string[]> = {};
    for (const p of reading.problems.slice(0, 100)) (fieldErrors[p.path ? `document.${p.path}` : 'document'] ??= []).push(p.message);
    const first = reading.problems[0];
    throw new AppError(
      'bad_request',
      `The document was not imported (${reading.problems.length} problem${reading.problems.length === 1 ? '' : 's'}): ${first.path || 'document'}: ${first.message}`,
      { fieldErrors },
    );
  }
  const doc = reading.document;
  return db.transaction(async (trx) => {
    const existing = await findTreeBySlug({ companyId: scope.companyId, slug: doc.tree.slug }, trx);
    const treeId =
      existing?.id ??
      (await insertTree(
        {
          companyId: scope.companyId,
          slug: doc.tree.slug,
          title: doc.tree.title,
          symptom: doc.tree.symptom,
          equipmentKind: doc.tree.equipmentKind,
        },
        trx,
      ));
    const draft = await insertDraft({ companyId: scope.companyId, treeId, userId: scope.userId, graph: doc.graph }, trx);
    if (!existing)
      await recordTreeEvent({ companyId: scope.companyId, treeId, versionId: draft.id, userId: scope.userId, kind: 'created' }, trx);
    await recordTreeEvent(
      {
        companyId: scope.companyId,
        treeId,
        versionId: draft.id,
        userId: scope.userId,
        kind: 'imported',
        detail: { format: doc.format, formatVersion: doc.formatVersion, sourceVersion: doc.source?.version ?? null },
      },
      trx,
    );
    return { treeId, ...draft, status: 'draft' as const };
  });
}
