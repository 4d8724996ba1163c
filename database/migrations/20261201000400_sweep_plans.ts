import type { Knex } from 'knex';

/**
 * Sweep plans: a setup turned into the list of poses the student measures, with each pose's
 * predicted values. A plan's setup cannot be deleted while the plan exists (RESTRICT; the app refuses
 * first naming the plan). Points are rewritten whenever a draft's axes change, so they cascade with it.
 * `pending_predicted` holds a running computation's values until the whole run is done, when one
 * transaction moves them into `predicted`: a plan never shows a mix of two runs, and a failed or
 * cancelled recompute leaves the earlier predictions in place.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sweep_plans', (t) => {
    t.increments('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.integer('setup_id').unsigned().notNullable().references('id').inTable('setups').onDelete('RESTRICT');
    t.string('name', 120).notNullable();
    t.enum('state', ['draft', 'on_bench', 'in_review', 'accepted']).notNullable().defaultTo('draft');
    // PlanAxis[] (src/lib/plans/axes.ts): values in SI plus the unit the person typed them in
    t.json('axes').notNullable();
    t.integer('repeats').notNullable().defaultTo(1);
    t.integer('reference_every').nullable();
    t.enum('order_mode', ['as_listed', 'serpentine', 'shuffled']).notNullable().defaultTo('as_listed');
    t.integer('shuffle_seed').nullable();
    t.double('minutes_per_point').notNullable();
    t.text('notes').nullable();
    t.enum('prediction_status', ['none', 'running', 'done', 'failed', 'cancelled']).notNullable().defaultTo('none');
    t.integer('prediction_progress').notNullable().defaultTo(0);
    t.integer('prediction_total').notNullable().defaultTo(0);
    t.text('prediction_error').nullable();
    // uuid of the computation allowed to write; a newer run replaces it and the older one stops
    t.string('prediction_run_id', 36).nullable();
    t.string('solver_version', 20).nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['study_id', 'name']);
    t.index(['setup_id']);
  });

  await knex.schema.createTable('sweep_points', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    // measurement order, 1..n
    t.integer('seq').notNullable();
    t.integer('repeat_index').notNullable();
    t.boolean('is_reference').notNullable().defaultTo(false);
    // { distance, lateralOffset, tiltDeg, frequencyHz?, loadResistance? } [m, m, degrees, Hz, ohm]
    t.json('pose').notNullable();
    // PointPrediction (src/lib/plans/types.ts) in SI, or null until computed
    t.json('predicted').nullable();
    t.string('solver_version', 20).nullable();
    // the running computation's values, moved into `predicted` when the whole run is done
    t.json('pending_predicted').nullable();
    t.unique(['plan_id', 'seq']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sweep_points');
  await knex.schema.dropTableIfExists('sweep_plans');
}
