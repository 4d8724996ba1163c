import type { Knex } from 'knex';

/**
 * Review of a plan: comments on the plan or a point, points set aside as outliers by hand, fits of one
 * effective parameter (kept apart from the plan's prediction), the supervisors' decisions, and the
 * tolerance the summary counts against. Decisions and fits are append-only; a mark is removed by
 * deleting its row, and the audit trail keeps both events.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sweep_plans', (t) => {
    // fraction: 0.1 counts points more than 10 % from their prediction
    t.double('review_tolerance').notNullable().defaultTo(0.1);
  });

  await knex.schema.createTable('plan_comments', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    // null: on the plan as a whole
    t.bigInteger('point_id').unsigned().nullable().references('id').inTable('sweep_points').onDelete('CASCADE');
    t.integer('author_id').unsigned().notNullable().references('id').inTable('users');
    t.text('body').notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['plan_id', 'created_at']);
  });

  await knex.schema.createTable('outlier_marks', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    t.bigInteger('point_id').unsigned().notNullable().references('id').inTable('sweep_points').onDelete('CASCADE');
    t.string('reason', 500).notNullable();
    t.integer('marked_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['point_id']);
    t.index(['plan_id']);
  });

  await knex.schema.createTable('plan_fits', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    t.enum('model', ['tilt_offset', 'lateral_offset', 'distance_offset', 'extra_rx_resistance']).notNullable();
    t.enum('quantity', ['coupling', 'mutualInductance', 'efficiency']).notNullable();
    t.double('value').notNullable();
    t.double('uncertainty').notNullable();
    t.integer('poses_used').notNullable();
    t.double('chi_square').notNullable();
    t.double('reduced_chi_square').nullable();
    t.double('rms_relative_after').nullable();
    // [{ poseKey, value }] at every pose of the plan
    t.json('repredicted').notNullable();
    t.string('solver_version', 20).notNullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['plan_id', 'quantity', 'created_at']);
  });

  await knex.schema.createTable('plan_reviews', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    t.enum('decision', ['accepted', 'returned']).notNullable();
    t.text('reason').nullable();
    t.integer('reviewer_id').unsigned().notNullable().references('id').inTable('users');
    // AgreementSummary of the coupling coefficient when the decision was taken, or null
    t.json('summary').nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['plan_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('plan_reviews');
  await knex.schema.dropTableIfExists('plan_fits');
  await knex.schema.dropTableIfExists('outlier_marks');
  await knex.schema.dropTableIfExists('plan_comments');
  await knex.schema.alterTable('sweep_plans', (t) => {
    t.dropColumn('review_tolerance');
  });
}
