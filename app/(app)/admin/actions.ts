'use server';

import { actionOf } from '@/lib/server/operation';
import { createUserOp, updateCompanyOp, updateUserOp } from '@/lib/server/operations/company';

export const createUserAction = actionOf(createUserOp, { revalidate: () => ['/admin/users'] });

export const updateUserAction = actionOf(updateUserOp, { revalidate: () => ['/admin/users'] });

// The company name shows in every page's header.
export const updateCompanyAction = actionOf(updateCompanyOp, { revalidate: () => ['layout:/'] });
