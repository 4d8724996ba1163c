/**
 * Next calls register() once when a server process starts (not during `next build`). The Node.js
 * server sends the mail outbox from here; the edge runtime has no database, so it starts nothing,
 * and the import stays inside the branch so no edge bundle ever contains knex or nodemailer.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { startOutboxDispatcher } = await import('./lib/mail/outbox');
    startOutboxDispatcher();
  }
}
