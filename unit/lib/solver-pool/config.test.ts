/**
 * solverPoolConfig (src/lib/solver-pool/config.ts): defaults from the CPU count, overrides from the
 * environment, and malformed values refused naming the variable.
 */
import { DEFAULT_PER_OWNER_LIMIT, DEFAULT_QUEUE_LIMIT, DEFAULT_TIMEOUT_MS, solverPoolConfig } from '../../../src/lib/solver-pool/config';

describe('solverPoolConfig', () => {
  test.each([
    [1, 1],
    [2, 1],
    [8, 7],
  ])('with %i CPUs and no variables: %i worker(s), one core left to the web server', (cpus, size) => {
    expect(solverPoolConfig({}, cpus)).toEqual({ size, queueLimit: DEFAULT_QUEUE_LIMIT, perOwnerLimit: DEFAULT_PER_OWNER_LIMIT, timeoutMs: DEFAULT_TIMEOUT_MS });
  });
  test('SOLVER_WORKERS, SOLVER_QUEUE_LIMIT, SOLVER_PER_OWNER_LIMIT and SOLVER_TIMEOUT_MS override the defaults; empty means unset', () => {
    expect(solverPoolConfig({ SOLVER_WORKERS: '3', SOLVER_QUEUE_LIMIT: '0', SOLVER_PER_OWNER_LIMIT: '2', SOLVER_TIMEOUT_MS: '2500' }, 2))
      .toEqual({ size: 3, queueLimit: 0, perOwnerLimit: 2, timeoutMs: 2500 });
    expect(solverPoolConfig({ SOLVER_WORKERS: '', SOLVER_QUEUE_LIMIT: ' ' }, 4).size).toBe(3);
  });
  test.each([
    [{ SOLVER_WORKERS: '0' }, /SOLVER_WORKERS/],
    [{ SOLVER_WORKERS: 'many' }, /SOLVER_WORKERS/],
    [{ SOLVER_QUEUE_LIMIT: '-1' }, /SOLVER_QUEUE_LIMIT/],
    [{ SOLVER_PER_OWNER_LIMIT: '0' }, /SOLVER_PER_OWNER_LIMIT/],
    [{ SOLVER_TIMEOUT_MS: '1.5' }, /SOLVER_TIMEOUT_MS/],
  ])('refuses %j naming the variable', (env, name) => {
    expect(() => solverPoolConfig(env, 2)).toThrow(name);
  });
});
