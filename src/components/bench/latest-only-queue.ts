/**
 * Keeps at most one job of a kind in flight in a worker and only the newest one waiting. A job submitted
 * while another runs replaces any job already waiting, so a burst of drag updates computes the first and
 * the last, never the ones in between; the worker never builds up a backlog the UI would wait for.
 */
export class LatestOnlyQueue<T> {
  private nextId = 1;
  private inFlight: number | null = null;
  private pending: { id: number; job: T } | null = null;
  private latest = 0;

  /** `send` hands a job to the worker; the owner calls `complete(id)` when its answer arrives. */
  constructor(private readonly send: (id: number, job: T) => void) {}

  /** Queue a job; returns its id. Sent at once when nothing is in flight. */
  submit(job: T): number {
    const id = this.nextId++;
    this.latest = id;
    if (this.inFlight === null) {
      this.inFlight = id;
      this.send(id, job);
    } else {
      this.pending = { id, job };
    }
    return id;
  }

  /** The worker answered job `id`: send the waiting job, if any. Answers of unknown ids are ignored. */
  complete(id: number): void {
    if (id !== this.inFlight) return;
    this.inFlight = null;
    const next = this.pending;
    this.pending = null;
    if (next) {
      this.inFlight = next.id;
      this.send(next.id, next.job);
    }
  }

  /** Whether `id` is the newest job submitted (its answer describes the current state). */
  isLatest(id: number): boolean {
    return id === this.latest;
  }

  /** Something is computing or waiting. */
  get busy(): boolean {
    return this.inFlight !== null;
  }

  /** Forget the waiting job (when the worker is replaced, nothing in flight will answer). */
  reset(): void {
    this.inFlight = null;
    this.pending = null;
  }
}
