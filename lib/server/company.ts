import 'server-only';
import { cache } from 'react';
import { getCompany } from '@/db/companies';

/** The company's time zone for every date a page prints; read once per request however many parts ask. */
export const companyTimeZone = cache(async (companyId: string): Promise<string> => (await getCompany({ id: companyId })).timeZone);
