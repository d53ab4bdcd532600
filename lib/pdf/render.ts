import { renderToBuffer } from '@react-pdf/renderer';
import { createElement } from 'react';
import { ReportDocument, type ReportPhoto } from '@/lib/pdf/report-document';
import type { ReportVersion } from '@/lib/pdf/report-model';
import type { CallReportOut } from '@/lib/validations/api';

/** The report as PDF bytes, customer copy or office record. */
export async function renderReportPdf({
  report,
  version,
  photos = [],
}: {
  report: CallReportOut;
  version: ReportVersion;
  photos?: ReportPhoto[];
}): Promise<Buffer> {
  return renderToBuffer(createElement(ReportDocument, { report, version, photos }) as Parameters<typeof renderToBuffer>[0]);
}
