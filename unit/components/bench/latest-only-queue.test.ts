import { LatestOnlyQueue } from '@/components/bench/latest-only-queue';

function harness() {
  const sent: { id: number; job: string }[] = [];
  const queue = new LatestOnlyQueue<string>((id, job) => sent.push({ id, job }));
  return { sent, queue };
}

describe('LatestOnlyQueue: only the newest waiting job is computed', () => {
  test('a job is sent at once when nothing is in flight', () => {
    const { sent, queue } = harness();
    const id = queue.submit('a');
    expect(sent).toEqual([{ id, job: 'a' }]);
    expect(queue.busy).toBe(true);
  });

  test('a burst while one job runs computes the first and the last only', () => {
    const { sent, queue } = harness();
    const first = queue.submit('p1');
    queue.submit('p2');
    queue.submit('p3');
    const last = queue.submit('p4');
    expect(sent.map((s) => s.job)).toEqual(['p1']);
    queue.complete(first);
    expect(sent.map((s) => s.job)).toEqual(['p1', 'p4']);
    expect(sent[1].id).toBe(last);
    queue.complete(last);
    expect(queue.busy).toBe(false);
    expect(sent).toHaveLength(2);
  });

  test('answers of jobs not in flight are ignored (no double send)', () => {
    const { sent, queue } = harness();
    const a = queue.submit('a');
    queue.submit('b');
    queue.complete(a + 100);
    expect(sent).toHaveLength(1);
    queue.complete(a);
    queue.complete(a);
    expect(sent.map((s) => s.job)).toEqual(['a', 'b']);
  });

  test('isLatest tells whether an answer describes the current state', () => {
    const { queue } = harness();
    const a = queue.submit('a');
    expect(queue.isLatest(a)).toBe(true);
    const b = queue.submit('b');
    expect(queue.isLatest(a)).toBe(false);
    expect(queue.isLatest(b)).toBe(true);
  });

  test('reset forgets the job in flight and the waiting one', () => {
    const { sent, queue } = harness();
    const a = queue.submit('a');
    queue.submit('b');
    queue.reset();
    expect(queue.busy).toBe(false);
    queue.complete(a);
    expect(sent).toHaveLength(1);
    queue.submit('c');
    expect(sent.map((s) => s.job)).toEqual(['a', 'c']);
  });
});
