/**
 * Work a request goes on with after its answer has been sent (see answerThenDo in the auth
 * routes). It is tracked so that a shutdown — or a test closing its pool — waits for it instead
 * of cutting it off halfway.
 */
const pending = new Set<Promise<unknown>>();

export function track<T>(work: Promise<T>): Promise<T> {
  pending.add(work);
  const done = () => pending.delete(work);
  work.then(done, done);
  return work;
}

/** Resolves once every piece of tracked work has ended (successfully or not). */
export async function settleBackgroundWork(): Promise<void> {
  while (pending.size) await Promise.allSettled([...pending]);
}
