import type { Metadata } from 'next';
import Link from 'next/link';
import { StartDraftButton } from '@/components/trees/start-draft-button';
import { STATUS_LABEL } from '@/components/trees/status';
import { Time } from '@/components/ui/time-zone';
import { may } from '@/lib/policy';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getTreeForAuthoring } from '@/lib/server/trees';
import { treeDetailSchema } from '@/lib/validations/api';
import { startDraftAction } from '../actions';

export const metadata: Metadata = { title: 'Fault tree' };

const EVENT_LABEL: Record<string, string> = {
  created: 'created the tree',
  'draft-started': 'started a draft',
  edited: 'saved',
  submitted: 'submitted for review',
  approved: 'approved',
  returned: 'sent back with comments',
  published: 'published',
  retired: 'retired',
  imported: 'imported',
};

export default async function TreePage({
  params,
  searchParams,
}: {
  params: Promise<{ treeId: string }>;
  searchParams: Promise<{ submitted?: string }>;
}) {
  const { treeId } = await params;
  const { submitted } = await searchParams;
  const { user, scope } = await pageScope('trees.get');
  const tree = treeDetailSchema.parse(await orNotFound(getTreeForAuthoring({ scope, treeId })));
  const canEdit = may(user.role, 'trees.startDraft');
  const published = tree.versions.find((v) => v.status === 'published') ?? null;
  return (
    <div className="space-y-6">
      <div>
        <Link href="/trees" className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← Fault trees
        </Link>
        <h1 className="page-title">{tree.title}</h1>
        <p className="text-muted">
          {tree.symptom} · {tree.equipmentKind}
        </p>
      </div>
      {submitted && (
        <p role="status" className="card border-copper">
          Submitted for review. Another lead or an admin approves it; you can still read it here.
        </p>
      )}
      {tree.builtinUpdate && (
        <section className="card space-y-2 border-2 border-copper" aria-labelledby="builtin-update">
          <h2 id="builtin-update" className="text-lg font-bold">
            A newer built-in revision is available
          </h2>
          <p>
            The product now ships revision {tree.builtinUpdate.revision} of “{tree.builtinUpdate.title}”. Your company&rsquo;s published
            version has its own edits, so it was not replaced. Compare them, and start a draft from the new revision if you want its
            changes.
          </p>
          <div className="flex flex-wrap gap-2">
            <Link className="btn-primary" href={`/trees/versions/${tree.builtinUpdate.publishedVersionId}/diff?against=builtin`}>
              See what changed
            </Link>
            {canEdit && (
              <StartDraftButton
                treeId={tree.id}
                draft={{ fromBuiltin: true }}
                label="Start a draft from the built-in revision"
                startDraft={startDraftAction}
              />
            )}
          </div>
        </section>
      )}
      {canEdit && (
        <div className="flex flex-wrap gap-2">
          {published && (
            <StartDraftButton
              primary
              treeId={tree.id}
              draft={{ fromVersionId: published.id }}
              label={`New draft from version ${published.version}`}
              startDraft={startDraftAction}
            />
          )}
          <StartDraftButton treeId={tree.id} draft={{}} label="New draft from scratch" startDraft={startDraftAction} />
        </div>
      )}
      <section aria-labelledby="versions" className="card overflow-x-auto p-0">
        <h2 id="versions" className="px-5 pt-4 text-lg font-bold">
          Versions
        </h2>
        <table className="w-full min-w-[40rem] text-left">
          <thead className="border-b border-line text-sm text-muted">
            <tr>
              <th className="px-5 py-2">Version</th>
              <th className="px-3 py-2">State</th>
              <th className="px-3 py-2">Written by</th>
              <th className="px-3 py-2">Last saved</th>
              <th className="px-3 py-2" />
            </tr>
          </thead>
          <tbody>
            {tree.versions.map((v) => (
              <tr key={v.id} className="border-b border-line last:border-0">
                <td className="px-5 py-2 font-semibold">{v.version}</td>
                <td className="px-3 py-2">
                  {STATUS_LABEL[v.status]}
                  {v.reviewComments.length > 0 && v.status === 'draft' && (
                    <span className="block text-sm text-muted">sent back with {v.reviewComments.length} comment(s)</span>
                  )}
                </td>
                <td className="px-3 py-2">{v.author?.name ?? 'the product'}</td>
                <td className="px-3 py-2">
                  <Time value={v.updatedAt} />
                  {v.updatedBy && <span className="block text-sm text-muted">by {v.updatedBy.name}</span>}
                </td>
                <td className="px-3 py-2">
                  <div className="flex flex-wrap justify-end gap-2">
                    <Link
                      className={v.status === 'in_review' || v.status === 'approved' ? 'btn-primary' : 'btn-secondary'}
                      href={v.status === 'draft' && canEdit ? `/trees/versions/${v.id}/edit` : `/trees/versions/${v.id}`}
                    >
                      {v.status === 'draft' && canEdit
                        ? 'Edit'
                        : v.status === 'in_review'
                          ? 'Review'
                          : v.status === 'approved'
                            ? 'Publish'
                            : 'Open'}
                    </Link>
                    {published && published.id !== v.id && (
                      <Link className="btn-secondary" href={`/trees/versions/${v.id}/diff?against=${published.id}`}>
                        Diff with published
                      </Link>
                    )}
                  </div>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-labelledby="history" className="card">
        <h2 id="history" className="mb-2 text-lg font-bold">
          History
        </h2>
        {tree.events.length === 0 ? (
          <p className="text-muted">Nothing recorded yet.</p>
        ) : (
          <ol className="space-y-1">
            {tree.events.map((e) => (
              <li key={e.id} className="flex flex-wrap gap-x-2 border-b border-line py-1 last:border-0">
                <Time value={e.at} className="text-muted" />
                <span>
                  <strong>{e.user?.name ?? 'The product'}</strong> {EVENT_LABEL[e.kind] ?? e.kind}
                  {e.version !== null && <> version {e.version}</>}
                </span>
              </li>
            ))}
          </ol>
        )}
      </section>
    </div>
  );
}
