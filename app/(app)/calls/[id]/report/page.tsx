import type { Metadata } from 'next';
import { PrintButton } from '@/components/report/print-button';
import { ServiceReport } from '@/components/report/service-report';
import { BackLink } from '@/components/ui/back-link';
import { getCallReport } from '@/lib/server/calls';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { callReportSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Service report' };
export const dynamic = 'force-dynamic';

export default async function ReportPage({ params }: { params: Promise<{ id: string }> }) {
  const { scope } = await pageScope('calls.get');
  const { id } = await params;
  const report = callReportSchema.parse(await orNotFound(getCallReport({ scope, id })));
  return (
    <div className="space-y-4">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <BackLink href={`/calls/${id}`}>Back to the call</BackLink>
        <PrintButton />
      </div>
      <ServiceReport report={report} />
    </div>
  );
}
