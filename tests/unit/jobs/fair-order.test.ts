// The fair order of the processing queue: one person's long queue never holds back another's first job.
import { describe, expect, it } from 'vitest';
import { nextFairJob, type OwnerState, type QueuedJob } from '@/lib/jobs/fair-order';

const owners = (entries: Array<[number | null, OwnerState]>) => new Map(entries);

/** Runs the queue one job at a time with `slots` slots, as the runner does; returns the order jobs start in. */
function simulate(queue: QueuedJob[], slots: number): number[] {
  const waiting = [...queue];
  const states = new Map<number | null, OwnerState>();
  const running: QueuedJob[] = [];
  const order: number[] = [];
  let clock = 0;
  while (waiting.length > 0 || running.length > 0) {
    while (running.length < slots) {
      const next = nextFairJob(waiting, states);
      if (!next) break;
      waiting.splice(waiting.indexOf(next), 1);
      running.push(next);
      const state = states.get(next.owner) ?? { running: 0, lastStartedAt: null };
      states.set(next.owner, { running: state.running + 1, lastStartedAt: ++clock });
      order.push(next.id);
    }
    const done = running.shift()!;
    const state = states.get(done.owner)!;
    states.set(done.owner, { ...state, running: state.running - 1 });
  }
  return order;
}

describe('the fair order of queued jobs', () => {
  it('takes the oldest job when one person waits', () => {
    expect(nextFairJob([{ id: 4, owner: 1 }, { id: 9, owner: 1 }], owners([]))).toEqual({ id: 4, owner: 1 });
    expect(nextFairJob([], owners([]))).toBeNull();
  });

  it('starts a newcomer’s first job before the next job of someone who just had a turn', () => {
    const queue = [2, 3, 4, 5].map((id) => ({ id, owner: 1 })).concat([{ id: 6, owner: 2 }]);
    const state = owners([[1, { running: 0, lastStartedAt: 1000 }]]);
    expect(nextFairJob(queue, state)?.id).toBe(6);
  });

  it('prefers whoever has fewer jobs running', () => {
    const queue = [{ id: 1, owner: 1 }, { id: 2, owner: 2 }];
    const state = owners([
      [1, { running: 1, lastStartedAt: 5 }],
      [2, { running: 2, lastStartedAt: 1 }],
    ]);
    expect(nextFairJob(queue, state)?.id).toBe(1);
  });

  it('alternates between people with one slot, whatever the length of their queues', () => {
    // Person 1 queued ten jobs before person 2 and 3 queued theirs.
    const queue = [
      ...Array.from({ length: 10 }, (_, i) => ({ id: i + 1, owner: 1 })),
      { id: 11, owner: 2 },
      { id: 12, owner: 2 },
      { id: 13, owner: 3 },
    ];
    expect(simulate(queue, 1)).toEqual([1, 11, 13, 2, 12, 3, 4, 5, 6, 7, 8, 9, 10]);
  });

  it('counts the jobs of deleted accounts as one person of their own', () => {
    const queue = [{ id: 1, owner: null }, { id: 2, owner: null }, { id: 3, owner: 7 }];
    expect(simulate(queue, 1)).toEqual([1, 3, 2]);
  });
});
