import { routeOf } from '@/lib/server/operation';
import { reportEmailPreviewOp, sendReportEmailOp } from '@/lib/server/operations/mail';

// GET /api/calls/{id}/report-email – the draft e-mail of the report (recipients, subject, message, the PDF's name) and the call's earlier e-mails
export const GET = routeOf(reportEmailPreviewOp, { params: { id: 'id' } });

// POST /api/calls/{id}/report-email – queues the customer copy of the report as a PDF to the recipients (once per idempotency key)
export const POST = routeOf(sendReportEmailOp, { params: { id: 'id' }, bodyAs: 'email', status: (out) => (out.created ? 201 : 200) });
