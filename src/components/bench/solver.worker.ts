/// <reference lib="webworker" />
/**
 * The bench's solver thread: src/physics runs here so dragging never waits for a quadrature. The bench
 * keeps at most one job per kind in flight (latest-only-queue.ts), so this loop never needs to skip.
 */
import { answer, type WorkerRequest } from './solver-jobs';

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (event: MessageEvent<WorkerRequest>) => {
  const reply = answer(event.data);
  // the field map's values move to the page instead of being copied
  const transfer = reply.ok && reply.answer.kind === 'field' ? [reply.answer.values.buffer] : [];
  scope.postMessage(reply, transfer);
};
