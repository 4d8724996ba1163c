/**
 * Domain errors of the solver pool. Each carries the HTTP status the route answers with; the messages
 * are written for the person who sent the request and hold no internals.
 */
import { HttpError } from '../http/errors';

/** Every worker is busy and the queue is full: 503, try again after `retryAfterSeconds`. */
export class SolverBusyError extends HttpError {
  constructor(readonly retryAfterSeconds: number) {
    super(503, `The solver is busy with other requests. Try again in ${retryAfterSeconds} s.`, [], {
      'Retry-After': String(retryAfterSeconds),
    });
    this.name = 'SolverBusyError';
  }
}

/**
 * This person (or plan run) already has as many solves running or waiting as one owner may: 429, so a
 * client that floods the solver is told to slow down while everyone else's solves still find room.
 */
export class SolverQuotaError extends HttpError {
  constructor(readonly retryAfterSeconds: number, readonly limit: number) {
    super(429, `You already have ${limit} solves running or waiting. Try again in ${retryAfterSeconds} s.`, [], {
      'Retry-After': String(retryAfterSeconds),
    });
    this.name = 'SolverQuotaError';
  }
}

/** A job ran past the pool's time limit; its worker was stopped. */
export class SolverTimeoutError extends HttpError {
  constructor(readonly timeoutMs: number) {
    super(503, `The solve took longer than ${timeoutMs / 1000} s and was stopped. `
      + 'Try a looser tolerance (1e-4 is the live setting), fewer turns or fewer field points.');
    this.name = 'SolverTimeoutError';
  }
}

/** A worker failed on a job (a bug or a crashed thread); the detail goes to the server log only. */
export class SolverFailedError extends HttpError {
  constructor(readonly detail: string) {
    super(500, 'The solver failed on this request. Nothing was stored; try again, and report it if it persists.');
    this.name = 'SolverFailedError';
  }
}

/** The pool was closed (server shutting down). */
export class SolverClosedError extends HttpError {
  constructor() {
    super(503, 'The solver is shutting down. Try again in a moment.');
    this.name = 'SolverClosedError';
  }
}
