import 'server-only';
import { db } from '@/db/knex';
import { notFound } from '@/lib/errors';

export interface Company {
  id: string;
  name: string;
  officeEmail: string;
  displayUnits: 'us' | 'metric';
  /** IANA time zone name, e.g. America/Toronto: every date is shown in it. */
  timeZone: string;
}

interface CompanyRow {
  id: string;
  name: string;
  office_email: string;
  display_units: 'us' | 'metric';
  time_zone: string;
}

const toCompany = (row: CompanyRow): Company => ({
  id: row.id,
  name: row.name,
  officeEmail: row.office_email,
  displayUnits: row.display_units,
  timeZone: row.time_zone,
});

export async function getCompany({ id }: { id: string }): Promise<Company> {
  const row: CompanyRow | undefined = await db('companies').where({ id }).first();
  if (!row) throw notFound('That company');
  return toCompany(row);
}

export async function updateCompany({
  id,
  patch,
}: {
  id: string;
  /** The time zone stays as it is when the patch does not name one (clients from before the setting). */
  patch: { name: string; officeEmail: string; displayUnits: 'us' | 'metric'; timeZone?: string };
}): Promise<Company> {
  const [row] = await db('companies')
    .where({ id })
    .update({
      name: patch.name,
      office_email: patch.officeEmail,
      display_units: patch.displayUnits,
      ...(patch.timeZone ? { time_zone: patch.timeZone } : {}),
      updated_at: db.fn.now(),
    })
    .returning('*');
  if (!row) throw notFound('That company');
  return toCompany(row);
}
