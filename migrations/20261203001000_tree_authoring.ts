import type { Knex } from 'knex';

// Tree authoring: drafts that leads edit (each save raises `revision`), review by a second lead,
// publishing, and an audit trail of who did what to which version.
// Workflow: draft → in_review (submitted) → approved → published → retired; a reviewer returns an
// in_review or approved version to draft with comments per step. The trigger keeps the first
// migration's guarantee (a published or retired version never changes, is never deleted) and adds:
// only a draft's graph changes, and the status moves only along the workflow.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('tree_versions', (t) => {
    t.integer('revision').notNullable().defaultTo(1);
    t.uuid('based_on_id').nullable().references('tree_versions.id').onDelete('SET NULL');
    // A draft started from a built-in revision (the update a company that edited its tree is offered).
    t.integer('from_builtin_revision').nullable();
    t.uuid('updated_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('submitted_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('submitted_at', { useTz: true }).nullable();
    t.uuid('approved_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('approved_at', { useTz: true }).nullable();
    t.uuid('published_by').nullable().references('users.id').onDelete('SET NULL');
    t.uuid('returned_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('returned_at', { useTz: true }).nullable();
    // The reviewer's last return: [{ stepId?, text }], shown in the editor beside each step.
    t.jsonb('review_comments').notNullable().defaultTo('[]');
  });
  await knex.raw('ALTER TABLE tree_versions DROP CONSTRAINT tree_versions_status_check');
  await knex.raw(
    `ALTER TABLE tree_versions ADD CONSTRAINT tree_versions_status_check CHECK (status IN ('draft', 'in_review', 'approved', 'published', 'retired'))`,
  );
  await knex.raw(`ALTER TABLE tree_versions ADD CONSTRAINT tree_versions_revision_check CHECK (revision >= 1)`);
  // One published version per tree: of two publishes at once, one lands.
  await knex.raw(`CREATE UNIQUE INDEX tree_versions_one_published ON tree_versions (tree_id) WHERE status = 'published'`);

  await knex.raw(`
    CREATE OR REPLACE FUNCTION tree_versions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
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
           OR NEW.revision <> OLD.revision OR NEW.author_id IS DISTINCT FROM OLD.author_id
           OR NEW.approved_by IS DISTINCT FROM OLD.approved_by OR NEW.published_by IS DISTINCT FROM OLD.published_by
           OR NOT (NEW.status = OLD.status OR (OLD.status = 'published' AND NEW.status = 'retired')) THEN
          RAISE EXCEPTION 'tree version % is published and cannot change', OLD.id USING ERRCODE = 'P0001';
        END IF;
        RETURN NEW;
      END IF;
      IF NEW.graph IS DISTINCT FROM OLD.graph AND NOT (OLD.status = 'draft' AND NEW.status = 'draft') THEN
        RAISE EXCEPTION 'tree version % is not a draft: its graph cannot change', OLD.id USING ERRCODE = 'P0001';
      END IF;
      IF NEW.status <> OLD.status AND NOT (
           (OLD.status = 'draft' AND NEW.status = 'in_review')
        OR (OLD.status = 'in_review' AND NEW.status IN ('draft', 'approved'))
        OR (OLD.status = 'approved' AND NEW.status IN ('draft', 'published'))) THEN
        RAISE EXCEPTION 'tree version % cannot go from % to %', OLD.id, OLD.status, NEW.status USING ERRCODE = 'P0001';
      END IF;
      RETURN NEW;
    END $$;
  `);

  await knex.schema.createTable('tree_events', (t) => {
    t.bigIncrements('id').primary();
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('tree_id').notNullable().references('fault_trees.id').onDelete('CASCADE');
    t.uuid('version_id').nullable().references('tree_versions.id').onDelete('CASCADE');
    t.uuid('user_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('kind').notNullable();
    // What the event carries: the revision saved, the comments of a return, the imported format.
    t.jsonb('detail').notNullable().defaultTo('{}');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id', 'tree_id', 'at']);
    t.index(['version_id']);
  });
  await knex.raw(`ALTER TABLE tree_events ADD CONSTRAINT tree_events_kind_check CHECK (kind IN
    ('created', 'draft-started', 'edited', 'submitted', 'approved', 'returned', 'published', 'retired', 'imported'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('tree_events');
  await knex.raw(`
    CREATE OR REPLACE FUNCTION tree_versions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
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
  `);
  await knex.raw('DROP INDEX IF EXISTS tree_versions_one_published');
  await knex.raw('ALTER TABLE tree_versions DROP CONSTRAINT IF EXISTS tree_versions_revision_check');
  // Approved versions have no place in the first migration's statuses: back to review.
  await knex.raw(`UPDATE tree_versions SET status = 'in_review' WHERE status = 'approved'`);
  await knex.raw('ALTER TABLE tree_versions DROP CONSTRAINT tree_versions_status_check');
  await knex.raw(
    `ALTER TABLE tree_versions ADD CONSTRAINT tree_versions_status_check CHECK (status IN ('draft', 'in_review', 'published', 'retired'))`,
  );
  await knex.schema.alterTable('tree_versions', (t) => {
    for (const column of [
      'revision',
      'based_on_id',
      'from_builtin_revision',
      'updated_by',
      'updated_at',
      'submitted_by',
      'submitted_at',
      'approved_by',
      'approved_at',
      'published_by',
      'returned_by',
      'returned_at',
      'review_comments',
    ]) {
      t.dropColumn(column);
    }
  });
}
