import { routeOf } from '@/lib/server/operation';
import { resendMailOp } from '@/lib/server/operations/mail';

// POST /api/outbox/{id}/resend – sends a call's e-mail again as a new message (once per idempotency key)
export const POST = routeOf(resendMailOp, { params: { id: 'id' }, status: (out) => (out.created ? 201 : 200) });
