import 'server-only';
import knex, { type Knex } from 'knex';
import { knexConfigFromUrl } from './db-config';
import { serverEnv } from './env';

/**
 * The one Knex instance of the server. Cached on globalThis so that Next's development reloads do
 * not open a new connection pool on every edit.
 */
const globalForDb = globalThis as typeof globalThis & { coupletDb?: Knex };

export const db: Knex = globalForDb.coupletDb ?? (globalForDb.coupletDb = knex(knexConfigFromUrl(serverEnv().DATABASE_URL)));
