import "server-only";

/**
 * Work an answer must not wait for: the reset and sign-in-link e-mails, so the answer takes the
 * same time whether or not the address has an account. Errors are logged, never thrown at the
 * caller. Tests wait for it with settleBackground().
 */
const running = new Set<Promise<void>>();

export function runInBackground(name: string, task: () => Promise<void>): void {
  const promise = (async () => {
    try {
      await task();
    } catch (error) {
      console.error(`background task ${name} failed`, error);
    }
  })();
  running.add(promise);
  void promise.finally(() => running.delete(promise));
}

export async function settleBackground(): Promise<void> {
  while (running.size) await Promise.all([...running]);
}
