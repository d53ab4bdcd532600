import { customerReport, REPORT_DEFERRAL } from '@/lib/pdf/report-model';
import type { CallReportOut } from '@/lib/validations/api';

// What the report's e-mail says before anyone edits it: who it is for, the subject and a short
// plain-text message; the customer copy of the report goes with it as a PDF.

function day(d: string, timeZone: string): string {
  try {
    return new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric', timeZone }).format(new Date(d));
  } catch {
    return new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric', timeZone: 'UTC' }).format(new Date(d));
  }
}

/** The site's customer contact and the company's office, each once. */
export function reportRecipients(report: CallReportOut): string[] {
  return [...new Set([report.site.contactEmail, report.company.officeEmail].filter((a): a is string => Boolean(a)))];
}

export function composeReportEmail(report: CallReportOut): { to: string[]; subject: string; body: string } {
  const c = customerReport(report);
  const when = day(report.call.closedAt ?? report.call.openedAt, report.company.timeZone);
  const subject = `Service report: ${report.site.name}, ${report.unit.label}, ${when}`;
  const lines = [
    'Hello,',
    '',
    `Attached is the report of our service visit to ${report.site.name} (${report.site.address}) on ${when}.`,
    '',
  ];
  if (c.findings.length > 0) {
    lines.push('What we found:');
    for (const f of c.findings) lines.push(`- ${f.title}${f.verified ? ' (repaired and checked)' : ''}`);
    lines.push('');
  } else if (c.open.length > 0) {
    lines.push(...c.open, '');
  }
  const urgent = c.cautions.filter((k) => k.signal === 'DANGER' || k.signal === 'WARNING');
  if (urgent.length > 0) {
    lines.push('Please read the safety notes in the report before using the appliance.', '');
  }
  lines.push(
    report.company.officeEmail ? `Questions about this visit: ${report.company.officeEmail}` : 'Reply to this message with any questions.',
    '',
    REPORT_DEFERRAL,
    '',
    report.company.name,
  );
  return { to: reportRecipients(report), subject, body: lines.join('\n') };
}
