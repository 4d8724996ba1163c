import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';

/**
 * Demo data: an invented lab, the "Fernbrook Soil Robotics group", charging buried soil-moisture
 * probes from a pad under greenhouse seed trays. `npm start` runs this only on an empty database,
 * `npm test` on its fresh test database. Passwords are listed in the README.
 */
export const DEMO_ACCOUNTS = {
  admin: { email: 'admin@couplet.test', name: 'Rafaela Duarte', siteRole: 'admin', password: 'bench-admin-2026' },
  researcher: { email: 'ines.okafor@couplet.test', name: 'Ines Okafor', siteRole: 'researcher', password: 'bench-ines-2026' },
  student: { email: 'tomasz.rehn@couplet.test', name: 'Tomasz Rehn', siteRole: 'member', password: 'bench-tomasz-2026' },
  supervisor: { email: 'maren.solberg@couplet.test', name: 'Maren Solberg', siteRole: 'member', password: 'bench-maren-2026' },
  // Runs the second study, which the student and supervisor above are not on.
  otherResearcher: { email: 'kofi.mensah@couplet.test', name: 'Kofi Mensah', siteRole: 'researcher', password: 'bench-kofi-2026' },
} as const;

/** Lower than the app's cost: seeding speed matters in tests, and these passwords are public anyway. */
const SEED_BCRYPT_COST = 10;

export async function seed(knex: Knex): Promise<void> {
  // Children first, so foreign keys never block the reset.
  for (const table of ['audit_events', 'invitations', 'study_members', 'studies', 'sign_in_limits', 'users']) {
    await knex(table).del();
  }

  const ids: Record<keyof typeof DEMO_ACCOUNTS, number> = {} as Record<keyof typeof DEMO_ACCOUNTS, number>;
  for (const [key, account] of Object.entries(DEMO_ACCOUNTS) as [keyof typeof DEMO_ACCOUNTS, (typeof DEMO_ACCOUNTS)[keyof typeof DEMO_ACCOUNTS]][]) {
    const [id] = await knex('users').insert({
      email: account.email,
      name: account.name,
      site_role: account.siteRole,
      password_hash: await bcrypt.hash(account.password, SEED_BCRYPT_COST),
    });
    ids[key] = id;
  }

  const [padStudy] = await knex('studies').insert({
    name: 'Seed-tray pad to buried soil probes',
    summary:
      'A flat spiral pad under the greenhouse benches charges soil-moisture probes buried 5-20 cm deep in compost. ' +
      'How much does probe tilt after watering cost us, and does the tuned probe coil hold up at the deepest position?',
    frequency_hz: 6.78e6,
    created_by: ids.researcher,
  });
  await knex('study_members').insert([
    { study_id: padStudy, user_id: ids.researcher, role: 'researcher' },
    { study_id: padStudy, user_id: ids.student, role: 'student' },
    { study_id: padStudy, user_id: ids.supervisor, role: 'supervisor' },
  ]);

  const [railStudy] = await knex('studies').insert({
    name: 'Irrigation-rail cart docking coil',
    summary: 'A helical coil on the irrigation cart docks against a loop on the rail end stop; lateral play of the cart is the concern.',
    frequency_hz: 85e3,
    created_by: ids.otherResearcher,
  });
  await knex('study_members').insert([{ study_id: railStudy, user_id: ids.otherResearcher, role: 'researcher' }]);

  await knex('audit_events').insert([
    { study_id: padStudy, actor_id: ids.researcher, action: 'study.create', target_table: 'studies', target_id: String(padStudy), details: JSON.stringify({ seeded: true }) },
    { study_id: railStudy, actor_id: ids.otherResearcher, action: 'study.create', target_table: 'studies', target_id: String(railStudy), details: JSON.stringify({ seeded: true }) },
  ]);
}
