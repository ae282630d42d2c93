/**
 * Running a solve in slices inside the worker. Between slices the worker returns to its event loop, so a
 * newer request or a cancel is seen; the yield is a MessageChannel message rather than setTimeout(0),
 * which browsers hold back by 4 ms once timeouts nest, several times per preview solve.
 */
import type { CancelToken } from '@/lib/thermal/solve';
import { Cancelled } from '@/lib/thermal/solve';

export async function runSliced<T>(gen: Generator<void, T>, token: CancelToken, pause: () => Promise<void>, sliceMs = 8, now: () => number = () => performance.now()): Promise<T> {
  let t0 = now();
  for (;;) {
    if (token.aborted) throw new Cancelled();
    const r = gen.next();
    if (r.done) return r.value;
    if (now() - t0 >= sliceMs) {
      await pause();
      t0 = now();
    }
  }
}

/** A pause of one trip through the event loop, without the timer clamp. */
export function channelPause(): () => Promise<void> {
  const ch = new MessageChannel();
  const waiting: (() => void)[] = [];
  ch.port1.onmessage = () => waiting.shift()?.();
  return () => new Promise<void>((resolve) => {
    waiting.push(resolve);
    ch.port2.postMessage(null);
  });
}
