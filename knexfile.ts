import type { Knex } from 'knex';
import { DEFAULT_DATABASE_URL, knexConfigFromUrl } from './src/lib/db-config';

/** Knex CLI configuration (migrations and seeds in database/). `npm start` and `npm test` set DATABASE_URL. */
const config: Knex.Config = knexConfigFromUrl(process.env.DATABASE_URL ?? DEFAULT_DATABASE_URL);

export default config;
