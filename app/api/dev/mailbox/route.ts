import { routeOf } from '@/lib/server/operation';
import { mailboxOp } from '@/lib/server/operations/mail';

// GET /api/dev/mailbox – the messages the local SMTP sink caught, newest first (admins; empty with a real mail server)
export const GET = routeOf(mailboxOp);
