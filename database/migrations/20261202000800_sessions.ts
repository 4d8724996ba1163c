import type { Knex } from 'knex';

/**
 * Server-side records of sign-ins. The session cookie stays a signed JWT, but it carries the id of one
 * of these rows, and every request checks that the row exists and is not revoked. So signing out,
 * changing the password or disabling the account ends a session even where a copy of its cookie lives
 * on, which a JWT alone cannot do before it expires.
 *
 * They replace users.session_version, which could only end all of an account's sessions at once
 * (never "every one except this one") and never a single one.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('user_sessions', (t) => {
    // random (crypto.randomUUID), so the id in a cookie says nothing about other sessions
    t.string('id', 36).primary();
    t.integer('user_id').unsigned().notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    // when the server last saw the session at work (written at most every few minutes); null: not yet
    t.datetime('last_seen_at', { precision: 3 }).nullable();
    // set by sign-out, a password change or disabling the account; a revoked session never comes back
    t.datetime('revoked_at', { precision: 3 }).nullable();
    // "end this person's other sessions" reads the live ones of one user
    t.index(['user_id', 'revoked_at']);
  });

  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('session_version');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.integer('session_version').unsigned().notNullable().defaultTo(1).after('site_role');
  });
  await knex.schema.dropTableIfExists('user_sessions');
}
