import { z } from 'zod';
import { authorize, errorResponse, parseInput } from '@/lib/server/operation';
import { mailboxOp } from '@/lib/server/operations/mail';
import { readMailboxAttachment } from '@/lib/server/outbox';

const input = z.object({
  name: z.string().max(220, { error: 'That message name is too long.' }),
  part: z.coerce.number({ error: 'The part is a number.' }).int({ error: 'The part is a whole number.' }).min(0).max(50),
});

// GET /api/dev/mailbox/{name}/{part} – one attachment of a caught message (the dev mailbox's operation and policy row)
export async function GET(_request: Request, { params }: { params: Promise<{ name: string; part: string }> }): Promise<Response> {
  try {
    await authorize(mailboxOp.name);
    const { name, part } = parseInput(input, await params);
    const file = await readMailboxAttachment({ name, index: part });
    const type = /^[a-z]+\/[a-z0-9.+-]+$/i.test(file.contentType) ? file.contentType : 'application/octet-stream';
    return new Response(new Uint8Array(file.content), {
      headers: {
        'Content-Type': type,
        'Content-Disposition': `inline; filename="${file.filename.replace(/[^A-Za-z0-9._-]/g, '_')}"`,
        'Cache-Control': 'no-store',
      },
    });
  } catch (error) {
    return errorResponse(error);
  }
}
