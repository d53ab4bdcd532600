// POST /api/auth/sign-out – ends this browser's session.
import { route } from '@/lib/server/guard';
import { signOut } from '@/lib/server/auth';

export const POST = route({}, async () => {
  await signOut();
  return new Response(null, { status: 204 });
});
