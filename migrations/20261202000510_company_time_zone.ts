import type { Knex } from 'knex';

// The company's time zone (an IANA name such as America/Toronto): every date on screen and in the
// service report is shown in it, whatever the time zone of the server or the tablet. The check
// here is only a floor (a name, not a blank); the application validates the name against the
// runtime's list of zones.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('companies', (t) => {
    t.text('time_zone').notNullable().defaultTo('America/Toronto');
  });
  await knex.raw(`ALTER TABLE companies ADD CONSTRAINT companies_time_zone_check CHECK (time_zone ~ '^[A-Za-z0-9_+/-]{1,64}$')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE companies DROP CONSTRAINT IF EXISTS companies_time_zone_check');
  await knex.schema.alterTable('companies', (t) => {
    t.dropColumn('time_zone');
  });
}
