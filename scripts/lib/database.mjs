// Schema and demo data through the app's own Knex setup (knexfile.ts, database/migrations,
// database/seeds), run with the knex CLI so exactly what `npm run db:migrate` does happens here.
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { StepError, info, ok, step, rel } from './log.mjs';
import { runStep } from './processes.mjs';
import { countRows } from './mariadb.mjs';

function knexArgs(root, command) {
  if (!fs.existsSync(path.join(root, 'knexfile.ts'))) {
    throw new StepError(`knex ${command}`, 'knexfile.ts is missing at the repository root', {
      hint: 'the app must provide knexfile.ts (reading DATABASE_URL) with migrations and seeds in database/',
    });
  }
  return ['--knexfile', 'knexfile.ts', command];
}

async function knex(inst, env, command, logName) {
  const logFile = path.join(inst.logsDir, logName);
  await runStep({
    title: `knex ${command}`,
    cmd: path.join(inst.root, 'node_modules', '.bin', 'knex'),
    args: knexArgs(inst.root, command),
    env,
    cwd: inst.root,
    logFile,
    hint: `see ${rel(inst.root, logFile)}`,
  });
}

export async function migrate(inst, env) {
  step('running database migrations (knex migrate:latest)…');
  await knex(inst, env, 'migrate:latest', 'knex-migrate.log');
}

export async function seed(inst, env) {
  step('loading seed data (knex seed:run)…');
  await knex(inst, env, 'seed:run', 'knex-seed.log');
  ok('seed data loaded');
}

/**
 * Users in the database, or null if there is no users table. Through the root socket for our own
 * server; through mysql2 and DATABASE_URL for a server the developer configured.
 */
async function userCount(inst, env, ownServer) {
  if (ownServer) return countRows(inst, 'users');
  const require = createRequire(path.join(inst.root, 'package.json'));
  const mysql = require('mysql2/promise');
  const conn = await mysql.createConnection(env.DATABASE_URL);
  try {
    const [rows] = await conn.query(
      'SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = ?',
      ['users'],
    );
    if (Number(rows[0].n) === 0) return null;
    const [[{ n }]] = await conn.query('SELECT COUNT(*) AS n FROM users');
    return Number(n);
  } finally {
    await conn.end();
  }
}

/**
 * Dev only: seed when the database is fresh (no users), so a second `npm start` never wipes or
 * duplicates what a developer created.
 */
export async function seedIfFresh(inst, env, ownServer) {
  const n = await userCount(inst, env, ownServer);
  if (n === null) info('no users table after migrating; running the seeds anyway');
  if (n) {
    const startOver = ownServer ? ` (to start over: stop, delete ${rel(inst.root, inst.mariadbDir)}, start)` : '';
    info(`database already has ${n} user(s): seeds skipped${startOver}`);
    return;
  }
  await seed(inst, env);
}
