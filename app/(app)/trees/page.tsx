import type { Metadata } from 'next';
import { ComingLater } from '@/components/shell/coming-later';
import { requirePageUser } from '@/lib/server/guard';

export const metadata: Metadata = { title: 'Fault trees' };

export default async function TreesPage() {
  await requirePageUser({ page: '/trees' });
  return (
    <ComingLater title="Fault trees">
      Leads will edit steps and outcomes here, send drafts to another lead for review, run the isolation check on the bench and publish new
      versions. Until then every diagnosis runs the published default tree, “No heat — direct spark ignition”.
    </ComingLater>
  );
}
