'use server';

import { actionOf } from '@/lib/server/operation';
import { correctUnitOp } from '@/lib/server/operations/field';

export const correctUnitAction = actionOf(correctUnitOp, { revalidate: (input) => [`/units/${input.id}`] });
