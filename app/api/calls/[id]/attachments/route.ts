import { AppError } from '@/lib/errors';
import { MAX_UPLOAD_BYTES } from '@/lib/images';
import { assertCallTakesPhotos } from '@/lib/server/attachments';
import { assertSameOrigin, authorize, errorResponse, parseInput, routeOf } from '@/lib/server/operation';
import { listAttachmentsOp, uploadAttachmentOp } from '@/lib/server/operations/attachments';

// GET  /api/calls/{id}/attachments – the call's photos.
// POST /api/calls/{id}/attachments – multipart form-data: `file` (one photo), optional `answerId`
// (a reading or observation of the call) or `findingId` (a diagnosis of the call that reached a
// finding) → 201 { id, url, thumbnailUrl }. The JSON adapter's 1 MB limit and JSON-only rule do not
// fit a photo, so this runs the adapter's checks in its order by hand: same origin, session and
// role, the call's reach (404 before any byte is read), then the body: at most the photo limit
// plus the form's envelope (413), multipart only (415), and the photo itself (lib/images.ts).
export const GET = routeOf(listAttachmentsOp, { params: { id: 'id' } });

/** Room for the multipart boundaries and the small text fields around a photo at the limit. */
const ENVELOPE_BYTES = 64 * 1024;
const tooLarge = () => new AppError('payload_too_large', `That photo is too large: at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`);

async function readCapped(request: Request, cap: number): Promise<Buffer> {
  if (!request.body) return Buffer.alloc(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > cap) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  try {
    assertSameOrigin(request.headers);
    const { user, scope } = await authorize(uploadAttachmentOp.name);
    const id = (await params).id;
    await assertCallTakesPhotos({ scope, callId: id });
    const cap = MAX_UPLOAD_BYTES + ENVELOPE_BYTES;
    if (Number(request.headers.get('content-length') ?? '0') > cap) throw tooLarge();
    const contentType = request.headers.get('content-type') ?? '';
    if (!/^multipart\/form-data\s*;/i.test(contentType)) {
      throw new AppError('unsupported_media_type', 'Send the photo as multipart/form-data with the field "file".');
    }
    const raw = await readCapped(request, cap);
    let form: FormData;
    try {
      form = await new Response(new Uint8Array(raw), { headers: { 'content-type': contentType } }).formData();
    } catch {
      throw new AppError('bad_request', 'The form could not be read: send multipart/form-data with the field "file".');
    }
    const file = form.get('file');
    if (!(file instanceof Blob))
      throw new AppError('bad_request', 'Attach the photo as the form field "file".', { fieldErrors: { file: ['Attach a photo.'] } });
    const text = (name: string) => {
      const v = form.get(name);
      return typeof v === 'string' ? v : v === null ? undefined : '(a file)';
    };
    const input = parseInput(
      uploadAttachmentOp.input,
      { id, fields: { answerId: text('answerId'), findingId: text('findingId') }, file: Buffer.from(await file.arrayBuffer()) },
      uploadAttachmentOp.fieldsUnder,
    );
    const forwarded = request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    const result = await uploadAttachmentOp.run({
      user,
      scope,
      input,
      client: { address: forwarded || 'unknown', userAgent: request.headers.get('user-agent') },
    });
    const out = uploadAttachmentOp.output.safeParse(result);
    if (!out.success) throw new AppError('internal', 'Something went wrong on our side. Try again.');
    return Response.json(out.data, { status: 201, headers: { 'Cache-Control': 'no-store', Location: out.data.url } });
  } catch (error) {
    return errorResponse(error);
  }
}
