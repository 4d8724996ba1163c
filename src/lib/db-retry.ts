import 'server-only';

/**
 * InnoDB resolves a deadlock by rolling one transaction back (ER_LOCK_DEADLOCK, 1213); the rolled-back
 * work is meant to be run again (MariaDB's and MySQL's manuals say so: common practice). Writes that
 * take several locks at once (a plan with its points, predictions and the setup it reads) retry a few
 * times with a short random pause before the error reaches the person.
 */
export const DEADLOCK_ATTEMPTS = 4;

export function isDeadlock(error: unknown): boolean {
  const e = error as { code?: string; errno?: number } | null;
  return typeof e === 'object' && e !== null && (e.code === 'ER_LOCK_DEADLOCK' || e.errno === 1213);
}

export async function retryOnDeadlock<T>(work: () => Promise<T>, attempts = DEADLOCK_ATTEMPTS): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (error) {
      if (!isDeadlock(error) || attempt >= attempts) throw error;
      await new Promise((resolve) => setTimeout(resolve, 10 + Math.random() * 40 * attempt));
    }
  }
}
