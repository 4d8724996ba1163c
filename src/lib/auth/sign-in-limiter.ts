import 'server-only';
import { RateLimiterMySQL, RateLimiterRes } from 'rate-limiter-flexible';
import { db } from '../db';
import { serverEnv } from '../env';

/**
 * Slows down password guessing. Failed sign-ins are counted per account (e-mail) and, behind a
 * proxy that names the client, per client address. The counts live in MariaDB (sign_in_limits), so
 * they survive restarts and are shared by every server process. A success clears the account's count.
 */
const ACCOUNT_FAILURES_ALLOWED = 5;
const ADDRESS_FAILURES_ALLOWED = 30;
const WINDOW_SECONDS = 15 * 60;
const BLOCK_SECONDS = 15 * 60;

/**
 * The client address for rate limiting, known only behind a reverse proxy that sets X-Forwarded-For.
 * Without one every request would share one key, and a few bad guesses could lock everyone out.
 * Takes next-auth's plain header object or a fetch Request's Headers.
 */
export function clientAddress(headers: Headers | Record<string, unknown> | undefined): string | null {
  const forwarded = headers instanceof Headers ? headers.get('x-forwarded-for') : headers?.['x-forwarded-for'];
  if (typeof forwarded === 'string' && forwarded.length > 0) return forwarded.split(',')[0].trim();
  return null;
}

function databaseName(): string {
  return new URL(serverEnv().DATABASE_URL).pathname.replace(/^\//, '');
}

function limiter(keyPrefix: string, points: number) {
  return new RateLimiterMySQL({
    storeClient: db,
    storeType: 'knex',
    dbName: databaseName(),
    tableName: 'sign_in_limits',
    tableCreated: true,
    keyPrefix,
    points,
    duration: WINDOW_SECONDS,
    blockDuration: BLOCK_SECONDS,
  });
}

let limiters: { account: RateLimiterMySQL; address: RateLimiterMySQL } | undefined;
function getLimiters() {
  limiters ??= {
    account: limiter('signin_account', ACCOUNT_FAILURES_ALLOWED),
    address: limiter('signin_address', ADDRESS_FAILURES_ALLOWED),
  };
  return limiters;
}

export class SignInThrottledError extends Error {
  constructor(readonly retryAfterSeconds: number) {
    const minutes = Math.max(1, Math.ceil(retryAfterSeconds / 60));
    super(
      `Too many failed sign-ins. Sign-in for this account is paused for ${minutes} minute${minutes === 1 ? '' : 's'}; try again after that.`,
    );
    this.name = 'SignInThrottledError';
  }
}

function remainingBlock(res: RateLimiterRes | null, allowed: number): number {
  if (res && res.consumedPoints > allowed) return Math.ceil(res.msBeforeNext / 1000);
  return 0;
}

/** Throws SignInThrottledError when the account or the address is currently blocked. */
export async function assertSignInAllowed(email: string, address: string | null): Promise<void> {
  const { account, address: byAddress } = getLimiters();
  const [accountRes, addressRes] = await Promise.all([account.get(email), address ? byAddress.get(address) : null]);
  const wait = Math.max(remainingBlock(accountRes, ACCOUNT_FAILURES_ALLOWED), remainingBlock(addressRes, ADDRESS_FAILURES_ALLOWED));
  if (wait > 0) throw new SignInThrottledError(wait);
}

/** Counts one failed attempt; throws SignInThrottledError when this failure crosses the limit. */
export async function recordSignInFailure(email: string, address: string | null): Promise<void> {
  const { account, address: byAddress } = getLimiters();
  const results = await Promise.allSettled([account.consume(email), ...(address ? [byAddress.consume(address)] : [])]);
  for (const result of results) {
    if (result.status === 'rejected') {
      const reason = result.reason;
      if (reason instanceof RateLimiterRes) throw new SignInThrottledError(Math.ceil(reason.msBeforeNext / 1000));
      throw reason;
    }
  }
}

export async function clearSignInFailures(email: string): Promise<void> {
  await getLimiters().account.delete(email);
}
