import { AppError } from '@/lib/errors';
import { authorize, errorResponse, parseInput } from '@/lib/server/operation';
import { reportPdfOp } from '@/lib/server/operations/mail';

// GET /api/calls/{id}/report.pdf – the service report as a PDF: the customer copy, or ?version=office for the office record.
// The operation's checks in the adapters' order (session, role, input, the call's reach in the handler), with a binary answer.
export async function GET(request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  try {
    const { user, scope } = await authorize(reportPdfOp.name);
    const query = new URL(request.url).searchParams;
    const input = parseInput(reportPdfOp.input, { id: (await params).id, version: query.get('version') || undefined });
    const forwarded = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    const result = await reportPdfOp.run({
      user,
      scope,
      input,
      client: { address: forwarded || 'unknown', userAgent: request.headers.get('user-agent') },
    });
    const out = reportPdfOp.output.safeParse(result);
    if (!out.success) throw new AppError('internal', 'The PDF could not be made. Nothing was changed; try again.');
    return new Response(new Uint8Array(out.data.pdf), {
      status: 200,
      headers: {
        'Content-Type': 'application/pdf',
        'Content-Disposition': `${query.get('download') ? 'attachment' : 'inline'}; filename="${out.data.filename}"`,
        'Content-Length': String(out.data.pdf.length),
        'Cache-Control': 'no-store',
      },
    });
  } catch (error) {
    return errorResponse(error);
  }
}
