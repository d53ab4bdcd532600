import argon2 from 'argon2';
import type { Knex } from 'knex';

// Demo only (invented companies and people), for `npm start` and the tests. A deployment that does
// not set SEED_DEMO=true gets no demo users. Runs only on an empty database.
export const DEMO_PASSWORD = 'demo-password';

export async function seed(knex: Knex): Promise<void> {
  if (process.env.SEED_DEMO !== 'true') return;
  const [{ count }] = await knex('companies').count<{ count: string }[]>('* as count');
  if (Number(count) > 0) return;

  const hash = await argon2.hash(DEMO_PASSWORD, { type: argon2.argon2id });
  const [kestrel] = await knex('companies')
    .insert({ name: 'Kestrel Valley Heating Co.', office_email: 'office@kestrel-valley.demo.test', display_units: 'us' })
    .returning('id');
  const [ironbark] = await knex('companies')
    .insert({
      name: 'Ironbark Comfort Services',
      office_email: 'desk@other.demo.test',
      display_units: 'metric',
      time_zone: 'America/Vancouver',
    })
    .returning('id');

  const people: [string, string, string, string][] = [
    [kestrel.id, 'apprentice@demo.test', 'Noor Baptiste', 'apprentice'],
    [kestrel.id, 'technician@demo.test', 'Dale Okonkwo', 'technician'],
    [kestrel.id, 'lead@demo.test', 'Marguerite Sandoval', 'lead'],
    [kestrel.id, 'lead2@demo.test', 'Teodor Lindqvist', 'lead'],
    [kestrel.id, 'trainer@demo.test', 'Priya Halvorsen', 'trainer'],
    [kestrel.id, 'admin@demo.test', 'Gus Abernathy', 'admin'],
    [ironbark.id, 'admin@other.demo.test', 'Renata Fiore', 'admin'],
    [ironbark.id, 'technician@other.demo.test', 'Callum Achebe', 'technician'],
  ];
  await knex('users').insert(people.map(([company_id, email, name, role]) => ({ company_id, email, name, role, password_hash: hash })));
}
