import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { PrintButton } from '@/components/report/print-button';
import { ServiceReport } from '@/components/report/service-report';
import { AppError } from '@/lib/errors';
import { FIELD_ROLES } from '@/lib/roles';
import { getCallReport } from '@/lib/server/calls';
import { requirePageUser } from '@/lib/server/guard';
import { viewerOf } from '@/lib/server/viewer';

export const metadata: Metadata = { title: 'Service report' };
export const dynamic = 'force-dynamic';

export default async function ReportPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser({ roles: FIELD_ROLES });
  const { id } = await params;
  let report;
  try {
    report = await getCallReport({ viewer: viewerOf(user), id });
  } catch (error) {
    if (error instanceof AppError && error.code === 'not_found') notFound();
    throw error;
  }
  return (
    <div className="space-y-4">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <Link href={`/calls/${id}`} className="text-sm font-semibold text-muted underline underline-offset-4">
          ← Back to the call
        </Link>
        <PrintButton />
      </div>
      <ServiceReport report={report} />
    </div>
  );
}
