import 'server-only';
import type { Knex } from 'knex';
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

export async function listSites({ companyId }: { companyId: string }, trx: Knex = db): Promise<Site[]> {
  return (await trx('sites').where({ company_id: companyId }).orderBy('name')).map(toSite);
}

export async function getSite({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<Site> {
  if (!isUuid(id)) throw notFound('That site');
  const row = await trx('sites').where({ company_id: companyId, id }).first();
  if (!row) throw notFound('That site');
  return toSite(row);
}

export async function createSite(
  input: { companyId: string; name: string; address: string; contactEmail?: string | null },
  trx: Knex = db,
): Promise<Site> {
  const [row] = await trx('sites')
    .insert({ company_id: input.companyId, name: input.name, address: input.address, contact_email: input.contactEmail ?? null })
    .returning('*');
  return toSite(row);
}
