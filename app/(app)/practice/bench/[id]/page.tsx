import type { Metadata } from 'next';
import { BackLink } from '@/components/ui/back-link';
import { unitText } from '@/components/practice/format';
import { TreeProving } from '@/components/practice/tree-proving';
import { getCompany } from '@/db/companies';
import { getBenchSession } from '@/db/bench';
import { getPublishedVersionId } from '@/db/practice';
import { getTreeVersion } from '@/db/trees';
import { getFault } from '@/lib/bench';
import { seesFaults } from '@/lib/server/bench';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { DEFAULT_TREE } from '@/lib/trees/default-tree';

export const metadata: Metadata = { title: 'Prove the tree on the bench' };
export const dynamic = 'force-dynamic';

// A bench session of the user's own (another user's is not found), with the company's published
// no-heat tree walked against it in the wizard. Leads and admins open these from Practice.
export default async function BenchProvingPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { user, scope } = await pageScope('bench.sessions.get');
  const session = await orNotFound(getBenchSession({ scope: { ...scope, reach: 'own' }, id }));
  const [versionId, company] = await Promise.all([
    getPublishedVersionId({ companyId: scope.companyId, slug: DEFAULT_TREE.slug }),
    getCompany({ id: scope.companyId }),
  ]);
  const record = versionId ? await getTreeVersion({ companyId: scope.companyId, id: versionId }) : null;
  // Who may know the fault (trainers, leads, admins): the bench API's own rule.
  const fault = session.faultId && seesFaults(user) ? getFault(session.faultId) : null;
  return (
    <div className="space-y-6">
      <BackLink href="/practice">Practice</BackLink>
      <div>
        <h1 className="page-title">Prove the tree on the bench</h1>
        <p className="text-muted">{unitText(session.unit)}</p>
        <p className="mt-2 text-base" data-testid="bench-fault">
          {session.faultId === null ? (
            'No fault on this bench: a healthy unit.'
          ) : fault ? (
            <>
              Fault on the bench: <span className="font-semibold">{fault.title}</span>. {fault.description}
            </>
          ) : (
            'A fault is on this bench.'
          )}
        </p>
      </div>
      {record ? (
        <TreeProving
          sessionId={session.id}
          unit={session.unit}
          version={{ id: record.id, version: record.version, graph: record.graph }}
          title={record.title}
          displayUnits={company.displayUnits}
        />
      ) : (
        <p className="card text-muted">Your company has no published no-heat tree to walk: publish one from Fault trees first.</p>
      )}
    </div>
  );
}
