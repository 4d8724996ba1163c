import 'server-only';
import type { Knex } from 'knex';

/** Something in a study that needs a coil, named the way a person finds it ("setup “Deep probe”"). */
export interface CoilUse {
  kind: string;
  id: number;
  name: string;
}

interface CoilUser {
  /** How a message names one of these ("setup"). */
  kind: string;
  /** Rows of this table that use the coil, locked until the caller's transaction ends. */
  find: (trx: Knex.Transaction, coilId: number) => Promise<{ id: number; name: string }[]>;
}

/**
 * Everything that may refer to a coil: setups directly, sweep plans through their setup. A coil is
 * deletable only when every entry finds nothing.
 */
const COIL_USERS: CoilUser[] = [
  {
    kind: 'setup',
    find: (trx, coilId) =>
      trx('setups')
        .where('transmitter_coil_id', coilId)
        .orWhere('receiver_coil_id', coilId)
        .orderBy('name')
        .forUpdate()
        .select('id', 'name'),
  },
  {
    kind: 'sweep plan',
    find: (trx, coilId) =>
      trx('sweep_plans')
        .join('setups', 'setups.id', 'sweep_plans.setup_id')
        .where('setups.transmitter_coil_id', coilId)
        .orWhere('setups.receiver_coil_id', coilId)
        .orderBy('sweep_plans.name')
        .forUpdate()
        .select('sweep_plans.id', 'sweep_plans.name'),
  },
];

/** What uses the coil, in the caller's transaction so nothing can start using it before it is deleted. */
export async function findCoilUses(trx: Knex.Transaction, coilId: number): Promise<CoilUse[]> {
  const uses: CoilUse[] = [];
  for (const user of COIL_USERS) {
    for (const row of await user.find(trx, coilId)) uses.push({ kind: user.kind, id: row.id, name: row.name });
  }
  return uses;
}

/** "setup “A” and setup “B”" */
export function describeCoilUses(uses: CoilUse[]): string {
  const names = uses.map((use) => `${use.kind} “${use.name}”`);
  return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** The sweep plans built on a setup, locked in the caller's transaction (a setup they use stays). */
export async function findSetupUses(trx: Knex.Transaction, setupId: number): Promise<CoilUse[]> {
  const rows: { id: number; name: string }[] = await trx('sweep_plans').where('setup_id', setupId).orderBy('name').forUpdate().select('id', 'name');
  return rows.map((row) => ({ kind: 'sweep plan', id: row.id, name: row.name }));
}
