import type { Metadata } from 'next';
import Link from 'next/link';
import { DiffList } from '@/components/trees/diff-list';
import type { StepMark } from '@/components/trees/editor/tree-canvas';
import { VersionView } from '@/components/trees/version-view';
import { CURRENT_BUILTIN } from '@/lib/trees/builtin';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { diffVersions, getVersionForAuthoring } from '@/lib/server/trees';
import { authoringVersionSchema, treeDiffSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'What changed' };

export default async function DiffPage({
  params,
  searchParams,
}: {
  params: Promise<{ versionId: string }>;
  searchParams: Promise<{ against?: string }>;
}) {
  const { versionId } = await params;
  const { against } = await searchParams;
  const { scope } = await pageScope('treeVersions.diff');
  const version = authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: versionId })));
  if (!against) {
    return (
      <div className="space-y-4">
        <h1 className="page-title">What changed</h1>
        <p className="card">Choose the version to compare with from the tree&rsquo;s page.</p>
        <Link className="btn-secondary" href={`/trees/${version.treeId}`}>
          Back to {version.title}
        </Link>
      </div>
    );
  }
  const diff = treeDiffSchema.parse(await orNotFound(diffVersions({ scope, id: versionId, against })));
  // The canvas shows the newer side of the diff with its added and changed steps marked.
  const shown =
    diff.to.id === 'builtin'
      ? { id: 'builtin', revision: CURRENT_BUILTIN.revision, graph: CURRENT_BUILTIN.graph as unknown as typeof version.graph }
      : diff.to.id === version.id
        ? version
        : authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: diff.to.id })));
  const marks: [string, StepMark][] = [
    ...diff.added.map((s): [string, StepMark] => [s.stepId, 'added']),
    ...diff.changed.map((s): [string, StepMark] => [s.stepId, 'changed']),
    ...diff.rewired.filter((r) => !diff.changed.some((c) => c.stepId === r.stepId)).map((r): [string, StepMark] => [r.stepId, 'changed']),
  ];
  return (
    <div className="space-y-4">
      <div>
        <Link href={`/trees/${version.treeId}`} className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← {version.title}
        </Link>
        <h1 className="page-title">What changed</h1>
        <p className="text-muted">
          From {diff.from.label} to {diff.to.label}. On the canvas: {diff.to.label}, added and changed steps marked.
        </p>
        {diff.to.id === 'builtin' && (
          <p className="text-muted">Start a draft from the built-in revision on the tree&rsquo;s page to take these changes.</p>
        )}
      </div>
      <div className="grid gap-4 xl:grid-cols-[28rem_minmax(0,1fr)]">
        <DiffList diff={diff} />
        <VersionView version={shown} marks={marks} />
      </div>
    </div>
  );
}
