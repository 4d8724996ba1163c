import type { Knex } from 'knex';

/**
 * E-mail waiting to go out. A business write stores its e-mails here in its own transaction, so a
 * committed invitation, submission or decision always has its mail, and a mail relay that is down
 * delays the mail instead of refusing the work. The dispatcher (src/lib/mail/outbox.ts) sends due
 * rows and retries failed ones with a growing delay; rows are kept after sending, as the record of
 * what was sent when.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.bigIncrements('id').primary();
    t.string('to_address', 320).notNullable();
    // 998: the longest line RFC 5322 allows, so any subject a relay accepts fits
    t.string('subject', 998).notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    // what the mail is about: 'invitation', 'plan.submitted', 'plan.decision'
    t.string('kind', 40).notNullable();
    // the mail outlives a deleted study: it may already be on its way
    t.integer('study_id').unsigned().nullable().references('id').inTable('studies').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('attempts').unsigned().notNullable().defaultTo(0);
    // the last failure in one short line (never a stack trace)
    t.text('last_error').nullable();
    // when the dispatcher may next try it; a claimed row is pushed ahead by the claim's lease
    t.datetime('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('sent_at', { precision: 3 }).nullable();
    // the dispatcher's question: unsent (sent_at null) and due (next_attempt_at passed)
    t.index(['sent_at', 'next_attempt_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_outbox');
}
