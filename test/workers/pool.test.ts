import { afterEach, describe, expect, it } from 'vitest';
import { threadPortCreate } from '../../src/cli/threadPort.ts';
import { JobCancelled, jobDeadlineMs, workerPoolCreate, type WorkerPool } from '../../src/workers/pool.ts';
import { buffersOf } from '../../src/workers/protocol.ts';
import type { TestJobs } from './fixtures/testWorker.ts';

const ENTRY = new URL('./fixtures/testWorker.ts', import.meta.url);
let pool: WorkerPool<TestJobs> | null = null;
afterEach(() => pool?.destroy());

describe('workerPoolCreate over real Node worker threads', () => {
  it('runs jobs and returns values in the order asked', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 2);
    const out = await Promise.all([1, 2, 3, 4, 5].map((v) => pool!.run('echo', { value: v, delayMs: 5 })));
    expect(out).toEqual([2, 4, 6, 8, 10]);
  });

  it('moves buffers by transfer (the sender loses them)', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1);
    const data = new Float64Array([1, 2, 3.5]);
    const r = await pool.run('sum', { data }, buffersOf(data));
    expect(r).toEqual({ sum: 6.5, length: 3 });
    expect(data.length).toBe(0); // detached
  });

  it('a failing command rejects with its message and the pool goes on', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1);
    await expect(pool.run('fail', { message: 'truth/f1.png: not a PNG' })).rejects.toThrow('truth/f1.png: not a PNG');
    await expect(pool.run('echo', { value: 4 })).resolves.toBe(8);
  });

  it('a worker that dies fails its job with a clear error, is replaced, and the rest continue', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 2);
    const jobs = [
      pool.run('echo', { value: 1, delayMs: 30 }),
      pool.run('die', undefined),
      pool.run('crash', undefined),
      pool.run('echo', { value: 2 }),
      pool.run('echo', { value: 3 }),
    ];
    const settled = await Promise.allSettled(jobs);
    expect(settled.map((s) => s.status)).toEqual(['fulfilled', 'rejected', 'rejected', 'fulfilled', 'fulfilled']);
    expect((settled[1] as PromiseRejectedResult).reason.message).toMatch(/worker stopped while running this job \(exit code 7\)/);
    expect((settled[2] as PromiseRejectedResult).reason.message).toMatch(/worker stopped.*boom in a timer/);
    expect(pool.restarts()).toBe(2);
    expect((settled[4] as PromiseFulfilledResult<number>).value).toBe(6);
  });

  it('cancelAll rejects queued and running jobs with JobCancelled; new jobs run', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1);
    const first = pool.run('echo', { value: 1, delayMs: 100 });
    const queued = [2, 3, 4].map((v) => pool!.run('echo', { value: v }));
    await new Promise((r) => setTimeout(r, 20));
    pool.cancelAll();
    const settled = await Promise.allSettled([first, ...queued]);
    for (const s of settled) {
      expect(s.status).toBe('rejected');
      expect((s as PromiseRejectedResult).reason).toBeInstanceOf(JobCancelled);
    }
    await expect(pool.run('echo', { value: 21 })).resolves.toBe(42);
  });

  it('types each command\'s input and value from the job table (checked by npm run typecheck)', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1);
    const doubled: number = await pool.run('echo', { value: 3 });
    const summed: { sum: number; length: number } = await pool.run('sum', { data: new Float64Array([2, 5]) });
    expect([doubled, summed]).toEqual([6, { sum: 7, length: 2 }]);
    // @ts-expect-error: a command the table does not hold
    await expect(pool.run('nope', {})).rejects.toThrow('unknown worker command "nope"');
    // @ts-expect-error: the wrong input for echo
    await expect(pool.run('echo', { message: 'x' })).resolves.toBeNaN();
  });

  it('watchdog: a worker stuck in a busy loop is stopped at its deadline, replaced, and the rest are scored', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 2, { deadlineMs: () => 4000 });
    const t0 = Date.now();
    const jobs = [pool.run('spin', undefined), ...[1, 2, 3, 4].map((v) => pool!.run('echo', { value: v, delayMs: 10 }))];
    const settled = await Promise.allSettled(jobs);
    expect(settled.map((s) => s.status)).toEqual(['rejected', 'fulfilled', 'fulfilled', 'fulfilled', 'fulfilled']);
    expect((settled[0] as PromiseRejectedResult).reason.message).toBe('the worker did not finish this job within 4 s (stuck, or it closed itself); it was stopped and replaced');
    expect(Date.now() - t0).toBeGreaterThanOrEqual(4000);
    expect(pool.restarts()).toBe(1);
    // The replacement works.
    await expect(pool.run('echo', { value: 5 })).resolves.toBe(10);
  });

  it('watchdog: a worker that stops answering (closed its port) and one that is killed both fail their job, the pool goes on', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1, { deadlineMs: () => 4000 });
    const deaf = pool.run('deaf', undefined);
    const killed = pool.run('die', undefined);
    const after = pool.run('echo', { value: 7 });
    await expect(deaf).rejects.toThrow(/did not finish this job within 4 s/);
    await expect(killed).rejects.toThrow(/worker stopped while running this job \(exit code 7\)/);
    await expect(after).resolves.toBe(14);
    expect(pool.restarts()).toBe(2);
  });

  it('the deadline scales with the job\'s pixels: 30 s + 10 µs per pixel', async () => {
    const seen: (number | null)[] = [];
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 1, {
      jobPixels: (_cmd, input) => (input as { pixels: number }).pixels,
      deadlineMs: (px) => (seen.push(px), jobDeadlineMs(px ?? 0)),
    });
    await expect(pool.run('sized', { pixels: 2048 * 1024, delayMs: 1 })).resolves.toBe(2048 * 1024);
    expect(seen).toEqual([2048 * 1024]);
    expect(jobDeadlineMs(2048 * 1024)).toBeCloseTo(30_000 + 20_971.52, 6);
    expect(jobDeadlineMs(100e6)).toBe(1_030_000);
  });

  it('pixel budget: jobs wait until the running ones leave room; one job always runs however large', async () => {
    pool = workerPoolCreate<TestJobs>(() => threadPortCreate(ENTRY), 3, { jobPixels: (_c, input) => (input as { pixels: number }).pixels, pixelBudget: 10 });
    const jobs = [4, 4, 4].map((px) => pool!.run('sized', { pixels: px, delayMs: 300 }));
    await new Promise((r) => setTimeout(r, 100));
    expect(pool.running()).toBe(2); // 4 + 4 fit in 10, a third would not
    await Promise.all(jobs);
    const huge = pool.run('sized', { pixels: 50, delayMs: 1 });
    await expect(huge).resolves.toBe(50);
  });
});
