import 'server-only';
import { z } from 'zod';

/** A record id from the path or the form. Anything that is not one of ours is answered 404 by `db/`, like a row of someone else. */
export const recordId = z.string({ error: 'The id is missing.' }).max(100, { error: 'That id is at most 100 characters.' });

/** An operation that takes nothing (extra fields are ignored). */
export const noInput = z.object({}).optional();
