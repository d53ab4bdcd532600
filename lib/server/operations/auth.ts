import 'server-only';
import { z } from 'zod';
import { pingDatabase } from '@/db/health';
import { publicUser, signIn, signOut, signOutEverywhere } from '@/lib/server/auth';
import { defineOperation, definePublicOperation } from '@/lib/server/operation';
import { noInput } from '@/lib/server/operations/shared';
import { emptySchema, healthSchema, publicUserSchema } from '@/lib/validations/api';
import { signInSchema } from '@/lib/validations/auth';

// POST /api/auth/sign-in
export const signInOp = definePublicOperation({
  name: 'auth.signIn',
  input: signInSchema,
  output: publicUserSchema,
  handler: async ({ input, client }) => publicUser(await signIn({ ...input, address: client.address, userAgent: client.userAgent })),
});

// POST /api/auth/sign-out
export const signOutOp = definePublicOperation({
  name: 'auth.signOut',
  input: noInput,
  output: emptySchema,
  handler: async () => {
    await signOut();
    return undefined;
  },
});

// POST /api/auth/sign-out-everywhere
export const signOutEverywhereOp = defineOperation({
  name: 'auth.signOutEverywhere',
  input: noInput,
  output: emptySchema,
  handler: async ({ user }) => {
    await signOutEverywhere({ userId: user.id });
    return undefined;
  },
});

// GET /api/me
export const getMeOp = defineOperation({
  name: 'me.get',
  input: noInput,
  output: publicUserSchema,
  handler: async ({ user }) => publicUser(user),
});

// GET /api/health
export const getHealthOp = definePublicOperation({
  name: 'health.get',
  input: z.unknown(),
  output: healthSchema,
  handler: async () => {
    const up = await pingDatabase();
    return { ok: up, db: up ? ('up' as const) : ('down' as const) };
  },
});
