import type { Metadata } from 'next';
import Link from 'next/link';
import { IsolationCheck } from '@/components/trees/isolation-check';
import { DEFAULT_BENCH_UNIT } from '@/lib/bench/bench';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getVersionForAuthoring } from '@/lib/server/trees';
import { authoringVersionSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Isolation check' };

export default async function IsolationPage({ params }: { params: Promise<{ versionId: string }> }) {
  const { versionId } = await params;
  const { scope } = await pageScope('treeVersions.authoring');
  const version = authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: versionId })));
  const home = version.status === 'draft' ? `/trees/versions/${version.id}/edit` : `/trees/versions/${version.id}`;
  const steps = version.graph.steps.map((s) => ({ id: String(s.id ?? ''), title: String(s.title ?? ''), kind: String(s.kind ?? '') }));
  return (
    <div className="space-y-4">
      <div>
        <Link href={home} className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← Back to version {version.version}
        </Link>
        <h1 className="page-title">
          Isolation check: {version.title}, version {version.version}
        </h1>
        <p className="text-muted">
          Every fault of the bench&rsquo;s library run through this version{version.status === 'draft' ? ' as last saved' : ''}, with the
          bench answering each step as an automatic technician would. A fault is isolated when the finding reached carries every tag the
          fault expects. Tap a step to open it{version.status === 'draft' ? ' in the editor' : ''}.
        </p>
        {version.problems.length > 0 && (
          <p className="mt-2 font-semibold">
            <span aria-hidden>⚠</span> This version has {version.problems.length} problem{version.problems.length === 1 ? '' : 's'}: the
            check walks it as it stands, so fix them first for a result that counts.
          </p>
        )}
      </div>
      <IsolationCheck versionId={version.id} steps={steps} defaultUnit={DEFAULT_BENCH_UNIT} stepHref={home} />
    </div>
  );
}
