import type { Knex } from 'knex';

// Fault trees and their versions, the field records (sites, units, service calls) and the
// diagnoses with their answers. Every table carries company_id so each query can be scoped.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('fault_trees', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.text('slug').notNullable();
    t.text('title').notNullable();
    t.text('symptom').notNullable();
    t.text('equipment_kind').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['company_id', 'slug']);
  });

  await knex.schema.createTable('tree_versions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('tree_id').notNullable().references('fault_trees.id').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.text('status').notNullable().defaultTo('draft');
    t.jsonb('graph').notNullable();
    t.uuid('author_id').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('published_at', { useTz: true }).nullable();
    t.unique(['tree_id', 'version']);
    t.index(['company_id']);
  });
  await knex.raw(
    `ALTER TABLE tree_versions ADD CONSTRAINT tree_versions_status_check CHECK (status IN ('draft', 'in_review', 'published', 'retired'))`,
  );
  // A published version is what diagnoses ran against: its graph, number and tree never change,
  // it can only be retired, and it cannot be deleted.
  await knex.raw(`
    CREATE FUNCTION tree_versions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        IF OLD.status IN ('published', 'retired') THEN
          RAISE EXCEPTION 'tree version % is published and cannot be deleted', OLD.id USING ERRCODE = 'P0001';
        END IF;
        RETURN OLD;
      END IF;
      IF OLD.status IN ('published', 'retired') THEN
        IF NEW.graph IS DISTINCT FROM OLD.graph OR NEW.version <> OLD.version OR NEW.tree_id <> OLD.tree_id
           OR NEW.company_id <> OLD.company_id OR NEW.published_at IS DISTINCT FROM OLD.published_at
           OR NOT (NEW.status = OLD.status OR (OLD.status = 'published' AND NEW.status = 'retired')) THEN
          RAISE EXCEPTION 'tree version % is published and cannot change', OLD.id USING ERRCODE = 'P0001';
        END IF;
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER tree_versions_guard BEFORE UPDATE OR DELETE ON tree_versions
      FOR EACH ROW EXECUTE FUNCTION tree_versions_guard();
  `);

  await knex.schema.createTable('sites', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('address').notNullable();
    t.text('contact_email').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id']);
  });

  await knex.schema.createTable('units', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('site_id').notNullable().references('sites.id').onDelete('CASCADE');
    t.text('label').notNullable();
    t.text('ignition').notNullable();
    t.text('fuel').notNullable();
    t.text('control_supply').notNullable();
    t.integer('transformer_va').notNullable();
    t.integer('install_year').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id', 'site_id']);
  });
  await knex.raw(`ALTER TABLE units ADD CONSTRAINT units_kind_check CHECK (
    ignition IN ('two-rod', 'single-rod') AND fuel IN ('natural-gas', 'lp') AND control_supply IN ('24v', 'line')
    AND transformer_va > 0)`);

  await knex.schema.createTable('service_calls', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('unit_id').notNullable().references('units.id').onDelete('CASCADE');
    t.text('complaint').notNullable();
    t.uuid('technician_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('status').notNullable().defaultTo('open');
    t.uuid('created_by').nullable().references('users.id').onDelete('SET NULL');
    t.text('repair_notes').nullable();
    // { cycles, flameSignal (µA), checks: [{ text, done }], notes } once recorded
    t.jsonb('verification').nullable();
    t.uuid('closed_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('opened_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('closed_at', { useTz: true }).nullable();
    t.index(['company_id', 'status']);
    t.index(['unit_id']);
  });
  await knex.raw(
    `ALTER TABLE service_calls ADD CONSTRAINT service_calls_status_check CHECK (status IN ('open', 'diagnosing', 'repaired', 'closed', 'referred'))`,
  );

  await knex.schema.createTable('diagnoses', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('call_id').notNullable().references('service_calls.id').onDelete('CASCADE');
    t.uuid('tree_version_id').notNullable().references('tree_versions.id');
    t.uuid('user_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('status').notNullable().defaultTo('in_progress');
    t.text('finding_step_id').nullable();
    t.uuid('signed_off_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('signed_off_at', { useTz: true }).nullable();
    t.timestamp('started_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('finished_at', { useTz: true }).nullable();
    t.index(['call_id']);
  });
  await knex.raw(`ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_status_check CHECK (status IN ('in_progress', 'found', 'escalated'))`);

  await knex.schema.createTable('answers', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('diagnosis_id').notNullable().references('diagnoses.id').onDelete('CASCADE');
    // Generated by the client: a retried save with the same id stores nothing new.
    t.uuid('client_id').notNullable();
    t.integer('seq').notNullable();
    t.text('step_id').notNullable();
    t.text('step_kind').notNullable();
    t.text('text').nullable();
    t.double('value').nullable();
    t.text('unit').nullable();
    t.text('quantity').nullable();
    t.integer('band_index').nullable();
    t.text('band_label').nullable();
    t.text('verdict').nullable();
    t.text('choice').nullable();
    t.boolean('confirmed').nullable();
    t.uuid('user_id').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // Undo keeps the row (nothing a user entered is lost) and takes it off the path.
    t.timestamp('undone_at', { useTz: true }).nullable();
    // The first answer sent back for this client id, returned again on a retry.
    t.jsonb('response').nullable();
    t.unique(['diagnosis_id', 'client_id']);
    t.index(['diagnosis_id', 'seq']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('answers');
  await knex.schema.dropTable('diagnoses');
  await knex.schema.dropTable('service_calls');
  await knex.schema.dropTable('units');
  await knex.schema.dropTable('sites');
  await knex.raw('DROP TRIGGER IF EXISTS tree_versions_guard ON tree_versions');
  await knex.schema.dropTable('tree_versions');
  await knex.raw('DROP FUNCTION IF EXISTS tree_versions_guard()');
  await knex.schema.dropTable('fault_trees');
}
