import type { Config } from 'jest';

/**
 * Unit tests (unit/ mirrors src/). TypeScript runs through @swc/jest; `server-only` is replaced by an
 * empty module because jest is not a React Server Components environment. Tests that use the
 * database read DATABASE_URL from `npm test`, which points at the fresh test database.
 */
const config: Config = {
  testEnvironment: 'node',
  roots: ['<rootDir>/unit'],
  testMatch: ['**/*.test.ts'],
  transform: { '^.+\\.(t|j)sx?$': ['@swc/jest', { jsc: { parser: { syntax: 'typescript', tsx: true }, target: 'es2022' } }] },
  moduleNameMapper: {
    '^server-only$': '<rootDir>/unit/support/empty-module.ts',
    '^@/(.*)$': '<rootDir>/src/$1',
  },
  // Database-backed suites share one test database; run files one at a time on this 2-core machine.
  maxWorkers: 1,
  testTimeout: 30000,
};

export default config;
