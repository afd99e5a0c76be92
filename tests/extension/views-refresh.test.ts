/**
 * A view beside the editor renders after a pause in typing, one render at a time
 * (client/src/views/refresh.ts). The rule being checked is common practice for editor side views
 * (debounce, coalesce, never overlap): a burst of keystrokes costs one render, not one per change.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { RefreshScheduler, VIEW_REFRESH_DELAY_MS } from '../../client/src/views/refresh';

/** A render that takes `ms` and counts how many ran and how many overlapped. */
function countingRender(ms: number) {
  const stats = { started: 0, finished: 0, running: 0, mostAtOnce: 0 };
  const render = async () => {
    stats.started += 1;
    stats.running += 1;
    stats.mostAtOnce = Math.max(stats.mostAtOnce, stats.running);
    await new Promise((resolve) => setTimeout(resolve, ms));
    stats.running -= 1;
    stats.finished += 1;
  };
  return { stats, render };
}

/** Lets timers and the promise callbacks they start run for `ms`. */
async function pass(ms: number): Promise<void> {
  await vi.advanceTimersByTimeAsync(ms);
}

describe('the refresh of a view beside the editor', () => {
  beforeEach(() => {
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('waits for a pause of 400–800 ms (common practice for typing)', () => {
    expect(VIEW_REFRESH_DELAY_MS).toBeGreaterThanOrEqual(400);
    expect(VIEW_REFRESH_DELAY_MS).toBeLessThanOrEqual(800);
  });

  it('renders once for a burst of 40 changes 80 ms apart, after the last one', async () => {
    const { stats, render } = countingRender(50);
    const scheduler = new RefreshScheduler(render, 600);
    for (let i = 0; i < 40; i += 1) {
      scheduler.changed();
      await pass(80);
    }
    expect(stats.started).toBe(0); // still typing: no render yet
    await pass(600 - 80 - 1);
    expect(stats.started).toBe(0);
    await pass(1);
    expect(stats.started).toBe(1);
    await pass(1000);
    expect(stats.finished).toBe(1);
    expect(scheduler.busy).toBe(false);
  });

  it('renders each change that follows a pause', async () => {
    const { stats, render } = countingRender(10);
    const scheduler = new RefreshScheduler(render, 500);
    for (let i = 0; i < 3; i += 1) {
      scheduler.changed();
      await pass(700);
    }
    expect(stats.finished).toBe(3);
  });

  it('never runs two renders at once; changes during a slow render lead to exactly one more', async () => {
    const { stats, render } = countingRender(3000); // a render slower than the pause
    const scheduler = new RefreshScheduler(render, 500);
    scheduler.changed();
    await pass(500);
    expect(stats.started).toBe(1);
    // Typing goes on while the render runs: pauses long enough to fire, several times.
    for (let i = 0; i < 4; i += 1) {
      scheduler.changed();
      await pass(600);
    }
    expect(stats.started).toBe(1);
    expect(stats.mostAtOnce).toBe(1);
    await pass(10_000);
    expect(stats.started).toBe(2); // the last state is shown once
    expect(stats.mostAtOnce).toBe(1);
    expect(scheduler.busy).toBe(false);
  });

  it('renders at once on request, still one at a time', async () => {
    const { stats, render } = countingRender(100);
    const scheduler = new RefreshScheduler(render, 500);
    scheduler.now();
    scheduler.now();
    await pass(0);
    expect(stats.started).toBe(1);
    await pass(1000);
    expect(stats.started).toBe(2);
    expect(stats.mostAtOnce).toBe(1);
  });

  it('goes on after a failed render and stops when disposed', async () => {
    let calls = 0;
    const scheduler = new RefreshScheduler(async () => {
      calls += 1;
      throw new Error('the server went away');
    }, 400);
    scheduler.changed();
    await pass(400);
    scheduler.changed();
    await pass(400);
    expect(calls).toBe(2);
    scheduler.changed();
    scheduler.dispose();
    await pass(1000);
    expect(calls).toBe(2);
  });
});
