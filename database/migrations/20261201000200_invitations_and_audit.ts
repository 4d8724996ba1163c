import type { Knex } from 'knex';

/**
 * Invitations (single-use, expiring links; only a SHA-256 of the token is stored) and the audit
 * trail of who did what to which row.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (t) => {
    t.increments('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.string('email', 254).notNullable();
    t.enum('role', ['researcher', 'student', 'supervisor']).notNullable();
    t.string('token_hash', 64).notNullable().unique();
    t.integer('invited_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('expires_at').notNullable();
    t.datetime('accepted_at').nullable();
    t.integer('accepted_by').unsigned().nullable().references('id').inTable('users');
    t.datetime('revoked_at').nullable();
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['study_id', 'email']);
  });

  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id').primary();
    t.integer('study_id').unsigned().nullable().references('id').inTable('studies').onDelete('SET NULL');
    t.integer('actor_id').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('action', 64).notNullable();
    t.string('target_table', 64).nullable();
    t.string('target_id', 64).nullable();
    t.json('details').nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['study_id', 'created_at']);
  });

  // State of the sign-in rate limiter (rate-limiter-flexible's MySQL store layout).
  await knex.schema.createTable('sign_in_limits', (t) => {
    t.string('key', 255).notNullable().primary();
    t.integer('points').notNullable().defaultTo(0);
    t.bigInteger('expire').unsigned().nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sign_in_limits');
  await knex.schema.dropTableIfExists('audit_events');
  await knex.schema.dropTableIfExists('invitations');
}
