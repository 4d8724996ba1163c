import type { Knex } from 'knex';

/**
 * Accounts, studies and study membership: the ground every other table stands on.
 * Site roles: `admin` manages accounts and may act on every study; `researcher` may start studies;
 * `member` joins studies by invitation only. Study roles are per study (study_members.role).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.string('email', 254).notNullable().unique();
    t.string('name', 120).notNullable();
    t.string('password_hash', 100).notNullable();
    t.enum('site_role', ['admin', 'researcher', 'member']).notNullable().defaultTo('member');
    // Bumped on password change or forced sign-out; sessions carrying an older value are refused.
    t.integer('session_version').unsigned().notNullable().defaultTo(1);
    t.datetime('disabled_at').nullable();
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('studies', (t) => {
    t.increments('id').primary();
    t.string('name', 160).notNullable();
    t.text('summary').nullable();
    // The link's operating frequency [Hz]; predictions default to it.
    t.double('frequency_hz').nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['name', 'created_by']);
  });

  await knex.schema.createTable('study_members', (t) => {
    t.increments('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.integer('user_id').unsigned().notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.enum('role', ['researcher', 'student', 'supervisor']).notNullable();
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['study_id', 'user_id']);
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('study_members');
  await knex.schema.dropTableIfExists('studies');
  await knex.schema.dropTableIfExists('users');
}
