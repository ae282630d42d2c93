import { describe, expect, it } from 'vitest';
import { channelPause, runSliced } from './drive';

function* steps(n: number, log: number[]): Generator<void, string> {
  for (let i = 0; i < n; i++) {
    log.push(i);
    yield;
  }
  return `done after ${n}`;
}

describe('runSliced: a solve in slices', () => {
  it('runs the steps to the end and pauses once per slice of the clock', async () => {
    let clock = 0;
    const now = () => clock++; // every reading advances the clock by 1 ms
    let pauses = 0;
    const log: number[] = [];
    const r = await runSliced(steps(100, log), { aborted: false }, async () => { pauses++; }, 8, now);
    expect(r).toBe('done after 100');
    expect(log.length).toBe(100);
    // Two clock readings per step plus one per pause: a pause every few steps, not every step and not never.
    expect(pauses).toBeGreaterThan(10);
    expect(pauses).toBeLessThan(50);
  });
  it('stops at the next slice once the token is aborted, with an AbortError, leaving the rest undone', async () => {
    const token = { aborted: false };
    const log: number[] = [];
    let clock = 0;
    const run = runSliced(steps(100, log), token, async () => { token.aborted = true; }, 8, () => (clock += 2));
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    expect(log.length).toBeGreaterThan(0);
    expect(log.length).toBeLessThan(100);
  });
  it('channelPause resolves each pause in turn through the event loop', async () => {
    const pause = channelPause();
    const order: number[] = [];
    await Promise.all([1, 2, 3].map((i) => pause().then(() => order.push(i))));
    expect(order).toEqual([1, 2, 3]);
  });
});
