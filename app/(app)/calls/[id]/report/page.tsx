import clsx from 'clsx';
import type { Metadata } from 'next';
import Link from 'next/link';
import { resendMailAction, sendReportEmailAction } from '@/app/(app)/calls/[id]/report/actions';
import { ReportEmailPanel } from '@/components/mail/report-email-panel';
import { PrintButton } from '@/components/report/print-button';
import { ServiceReport } from '@/components/report/service-report';
import { BackLink } from '@/components/ui/back-link';
import type { ReportVersion } from '@/lib/pdf/report-model';
import { may } from '@/lib/policy';
import { getCallReport } from '@/lib/server/calls';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { previewReportEmail } from '@/lib/server/outbox';
import { callReportSchema } from '@/lib/validations/api';
import { reportEmailPreviewSchema } from '@/lib/validations/mail';

export const metadata: Metadata = { title: 'Service report' };
export const dynamic = 'force-dynamic';

const TABS: { version: ReportVersion; label: string }[] = [
  { version: 'office', label: 'Office record' },
  { version: 'customer', label: 'Customer copy' },
];

export default async function ReportPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { user, scope } = await pageScope('calls.get');
  const { id } = await params;
  const version: ReportVersion = (await searchParams).version === 'customer' ? 'customer' : 'office';
  const report = callReportSchema.parse(await orNotFound(getCallReport({ scope, id })));
  const emailPreview = may(user.role, 'reports.emailPreview')
    ? reportEmailPreviewSchema.parse(await previewReportEmail({ scope: (await pageScope('reports.emailPreview')).scope, id }))
    : null;
  return (
    <div className="space-y-4">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <BackLink href={`/calls/${id}`}>Back to the call</BackLink>
        <div className="flex flex-wrap gap-2">
          <a href={`/api/calls/${id}/report.pdf${version === 'office' ? '?version=office' : ''}`} className="btn-secondary">
            Download PDF
          </a>
          <PrintButton />
        </div>
      </div>
      <nav aria-label="Report version" className="no-print flex flex-wrap gap-2">
        {TABS.map((t) => (
          <Link
            key={t.version}
            href={`/calls/${id}/report${t.version === 'office' ? '' : '?version=customer'}`}
            aria-current={t.version === version ? 'page' : undefined}
            className={clsx(t.version === version ? 'btn-primary' : 'btn-secondary')}
          >
            {t.label}
          </Link>
        ))}
      </nav>
      {emailPreview && <ReportEmailPanel callId={id} initial={emailPreview} sendReport={sendReportEmailAction} resend={resendMailAction} />}
      <ServiceReport report={report} version={version} />
    </div>
  );
}
