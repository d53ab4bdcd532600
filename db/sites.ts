import 'server-only';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';

export interface Site {
  id: string;
  name: string;
  address: string;
  contactEmail: string | null;
}

const toSite = (r: Record<string, unknown>): Site => ({
  id: r.id as string,
  name: r.name as string,
  address: r.address as string,
  contactEmail: (r.contact_email as string | null) ?? null,
});

export async function listSites({ companyId }: { companyId: string }): Promise<Site[]> {
  return (await db('sites').where({ company_id: companyId }).orderBy('name')).map(toSite);
}

export async function getSite({ companyId, id }: { companyId: string; id: string }): Promise<Site> {
  if (!isUuid(id)) throw notFound('That site');
  const row = await db('sites').where({ company_id: companyId, id }).first();
  if (!row) throw notFound('That site');
  return toSite(row);
}

export async function createSite(input: { companyId: string; name: string; address: string; contactEmail?: string | null }): Promise<Site> {
  const [row] = await db('sites')
    .insert({ company_id: input.companyId, name: input.name, address: input.address, contact_email: input.contactEmail ?? null })
    .returning('*');
  return toSite(row);
}
