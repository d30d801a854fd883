// Requests that wait for a sample's job to end (GET /api/samples/:id?wait=…) hear of it here: the job runners
// record every end in this process (sample-states.ts), which announces it, so that a waiting script gets its
// answer at once instead of at its next poll. Kept on globalThis: route bundles and the runner may each load
// this module.
import { EventEmitter, once } from 'node:events';
import { processWide } from '@/lib/maps/lru';

/** Waiting requests one person may hold at once; more are answered at once, as without `wait`. */
export const MAX_WAITS_PER_USER = 8;

function jobEnds(): EventEmitter {
  return processWide('sampleJobEnds', () => new EventEmitter().setMaxListeners(0));
}

/** Tells the requests waiting on this sample that its job ended (done, failed or cancelled). */
export function announceJobEnd(sampleId: number): void {
  jobEnds().emit(String(sampleId));
}

/** Resolves when the sample's job end is announced, after `ms`, or when `signal` aborts, whichever comes first. */
export async function jobEndOrTimeout(sampleId: number, ms: number, signal: AbortSignal): Promise<void> {
  try {
    await once(jobEnds(), String(sampleId), { signal: AbortSignal.any([signal, AbortSignal.timeout(ms)]) });
  } catch (error) {
    // The time is over or the request went away: an answer is due either way.
    if ((error as Error).name !== 'AbortError') throw error;
  }
}

/**
 * A place among the person's waiting requests: a function that gives it back, or null when they already hold
 * MAX_WAITS_PER_USER (each waiting request reads the sample every second: this bounds what one account can ask).
 */
export function takeWaitPlace(userId: number): (() => void) | null {
  const held = processWide('sampleJobWaits', () => new Map<number, number>());
  const count = held.get(userId) ?? 0;
  if (count >= MAX_WAITS_PER_USER) return null;
  held.set(userId, count + 1);
  return () => {
    const left = (held.get(userId) ?? 1) - 1;
    if (left > 0) held.set(userId, left);
    else held.delete(userId);
  };
}
