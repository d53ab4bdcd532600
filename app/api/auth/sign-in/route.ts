// POST /api/auth/sign-in – checks e-mail and password, sets the session cookie.
import { signInSchema } from '@/lib/validations/auth';
import { clientAddress, route } from '@/lib/server/guard';
import { publicUser, signIn } from '@/lib/server/auth';

export const POST = route({ body: signInSchema }, async ({ request, body }) => {
  const user = await signIn({ ...body, address: clientAddress(request) });
  return publicUser(user);
});
