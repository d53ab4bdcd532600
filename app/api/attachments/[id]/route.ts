import { AppError } from '@/lib/errors';
import { attachmentBytes } from '@/lib/server/attachments';
import { authorize, errorResponse, parseInput, routeOf } from '@/lib/server/operation';
import { attachmentLinkOp, removeAttachmentOp } from '@/lib/server/operations/attachments';

// GET /api/attachments/{id}[?size=thumb] – the photo, for whoever reaches its call: a redirect (302)
// to a signed link that works for a few minutes. The app's own pages allow images from the app
// only (their Content-Security-Policy, proxy.ts), so when the browser loads it as an image
// (Sec-Fetch-Dest: image) the same check answers with the bytes instead of the redirect.
// DELETE /api/attachments/{id} – removes the photo while its call is open.
export async function GET(request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  try {
    const { user, scope } = await authorize(attachmentLinkOp.name);
    const query = new URL(request.url).searchParams;
    const input = parseInput(attachmentLinkOp.input, { id: (await params).id, size: query.get('size') || undefined });
    if (request.headers.get('sec-fetch-dest') === 'image') {
      const { data, contentType } = await attachmentBytes({ scope, id: input.id, size: input.size });
      return new Response(new Uint8Array(data), {
        status: 200,
        headers: {
          'Content-Type': contentType,
          'Content-Length': String(data.length),
          'Cache-Control': 'private, max-age=300',
          Vary: 'Sec-Fetch-Dest',
        },
      });
    }
    const forwarded = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    const result = await attachmentLinkOp.run({
      user,
      scope,
      input,
      client: { address: forwarded || 'unknown', userAgent: request.headers.get('user-agent') },
    });
    const out = attachmentLinkOp.output.safeParse(result);
    if (!out.success) throw new AppError('internal', 'Something went wrong on our side. Try again.');
    return new Response(null, { status: 302, headers: { Location: out.data.url, 'Cache-Control': 'no-store', Vary: 'Sec-Fetch-Dest' } });
  } catch (error) {
    return errorResponse(error);
  }
}

export const DELETE = routeOf(removeAttachmentOp, { params: { id: 'id' } });
