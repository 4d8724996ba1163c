/**
 * The intake lane of busy routes (src/lib/http/intake-lane.ts): requests take turns, each after the
 * callbacks that were already waiting (a page's database answer, a new request), and one whose client
 * went away leaves without doing its work.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { HttpError } from '../../../src/lib/http/errors';
import { createIntakeLane } from '../../../src/lib/http/intake-lane';

const live = () => new AbortController().signal;
const tick = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Keeps the thread busy for `ms`, as a request's synchronous steps do. */
function busy(ms: number) {
  const until = performance.now() + ms;
  while (performance.now() < until) {
    // spin
  }
}

describe('an intake lane', () => {
  test('lets one intake run at a time, in the order they came', async () => {
    const through = createIntakeLane();
    const log: string[] = [];
    let running = 0;
    let most = 0;
    const intake = (name: string) => through(live(), async () => {
      running++;
      most = Math.max(most, running);
      log.push(`${name} starts`);
      await tick();
      await tick();
      log.push(`${name} ends`);
      running--;
      return name;
    });
    expect(await Promise.all(['a', 'b', 'c'].map(intake))).toEqual(['a', 'b', 'c']);
    expect(most).toBe(1);
    expect(log).toEqual(['a starts', 'a ends', 'b starts', 'b ends', 'c starts', 'c ends']);
  });

  test('a wider lane runs that many at once', async () => {
    const through = createIntakeLane(2);
    let running = 0;
    let most = 0;
    await Promise.all([1, 2, 3, 4, 5].map(() => through(live(), async () => {
      running++;
      most = Math.max(most, running);
      await tick();
      running--;
    })));
    expect(most).toBe(2);
  });

  test('a callback queued while one intake ran goes before the next intake', async () => {
    const through = createIntakeLane();
    const log: string[] = [];
    await Promise.all([
      through(live(), async () => {
        // what a page request's next step looks like to the event loop
        setImmediate(() => log.push('page step'));
        log.push('first intake');
      }),
      through(live(), async () => {
        log.push('second intake');
      }),
    ]);
    expect(log).toEqual(['first intake', 'page step', 'second intake']);
  });

  test('a page request that arrives on its socket while intakes are queued is served before the next of them', async () => {
    const order: string[] = [];
    const server = http.createServer((request, response) => {
      order.push('page served');
      response.end('ok');
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const get = () => new Promise<void>((resolve, reject) => {
      http.get({ host: '127.0.0.1', port, agent }, (response) => {
        response.resume();
        response.on('end', resolve);
      }).on('error', reject);
    });
    try {
      await get(); // the connection is open, as a reading user's is
      order.length = 0;
      const through = createIntakeLane();
      let page: Promise<void> | undefined;
      const intakes = [1, 2, 3].map((n) => through(live(), async () => {
        if (n === 1) {
          page = get();
          busy(50); // the request's bytes arrive while this intake holds the thread
        }
        order.push(`intake ${n}`);
      }));
      await Promise.all([...intakes, new Promise<void>((resolve) => setTimeout(resolve, 20))]);
      await page;
      expect(order.indexOf('page served')).toBeGreaterThan(order.indexOf('intake 1'));
      expect(order.indexOf('page served')).toBeLessThan(order.indexOf('intake 2'));
    } finally {
      agent.destroy();
      await new Promise((resolve) => server.close(resolve));
    }
  });

  test('an intake whose client went away while it waited never runs, and the next one still does', async () => {
    const through = createIntakeLane();
    const ran: string[] = [];
    const gone = new AbortController();
    const first = through(live(), async () => {
      gone.abort();
      ran.push('first');
    });
    const second = through(gone.signal, async () => {
      ran.push('second');
    });
    const third = through(live(), async () => {
      ran.push('third');
    });
    await first;
    await expect(second).rejects.toMatchObject({ status: 503 });
    await expect(second).rejects.toBeInstanceOf(HttpError);
    await third;
    expect(ran).toEqual(['first', 'third']);
  });

  test('an intake that fails gives its turn to the next', async () => {
    const through = createIntakeLane();
    const failed = through(live(), async () => {
      throw new Error('malformed body');
    });
    const next = through(live(), async () => 'read');
    await expect(failed).rejects.toThrow('malformed body');
    await expect(next).resolves.toBe('read');
  });
});
