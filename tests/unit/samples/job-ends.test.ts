// Waiting for a sample's job to end (GET /api/samples/:id?wait=N): the announcement wakes exactly the requests
// waiting on that sample, a wait ends on its own after its time or when the request goes away, and one person
// holds a bounded number of waiting requests.
import { describe, expect, it } from 'vitest';
import { announceJobEnd, jobEndOrTimeout, MAX_WAITS_PER_USER, takeWaitPlace } from '@/lib/samples/job-ends';

const never = new AbortController().signal;

describe('waiting for a job to end', () => {
  it('wakes the requests waiting on the announced sample, and only those', async () => {
    const woken: number[] = [];
    const a = jobEndOrTimeout(101, 60_000, never).then(() => woken.push(101));
    const b = jobEndOrTimeout(102, 60_000, never).then(() => woken.push(102));
    announceJobEnd(101);
    await a;
    expect(woken).toEqual([101]);
    announceJobEnd(102);
    await b;
    expect(woken).toEqual([101, 102]);
  });

  it('ends after its time, or at once when the request goes away', async () => {
    const started = performance.now();
    await jobEndOrTimeout(103, 50, never);
    expect(performance.now() - started).toBeGreaterThanOrEqual(45);

    const gone = new AbortController();
    const waiting = jobEndOrTimeout(104, 60_000, gone.signal);
    gone.abort();
    await waiting;
    const alreadyGone = new AbortController();
    alreadyGone.abort();
    await jobEndOrTimeout(105, 60_000, alreadyGone.signal);
  });

  it('gives one person at most MAX_WAITS_PER_USER places, each given back once', () => {
    const places = Array.from({ length: MAX_WAITS_PER_USER }, () => takeWaitPlace(7));
    expect(places.every((release) => release !== null)).toBe(true);
    expect(takeWaitPlace(7)).toBeNull();
    // Another person is not affected.
    const other = takeWaitPlace(8);
    expect(other).not.toBeNull();
    places[0]!();
    const again = takeWaitPlace(7);
    expect(again).not.toBeNull();
    expect(takeWaitPlace(7)).toBeNull();
    for (const release of [...places.slice(1), again, other]) release!();
    expect(Array.from({ length: MAX_WAITS_PER_USER }, () => takeWaitPlace(7)).every((release) => release !== null)).toBe(true);
  });
});
