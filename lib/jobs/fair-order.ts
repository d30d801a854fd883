// Which queued job runs next, fairly between the people who queued them: pure, so that any queue (the embedded
// runner, or a queue on a separate store) can use the same rule.
//
// The rule: the person with the fewest jobs running goes first; between equals, the one whose last job started
// longest ago (never is longest); between those, the one whose oldest queued job came first. Their oldest queued
// job runs. So one person's long queue never makes another's first job wait for more than the jobs already
// running: as soon as a slot frees, the newcomer is ahead of the person who just had a turn.

export interface QueuedJob {
  id: number;
  /** Who queued it (null when that account is gone: such jobs count as one person of their own). */
  owner: number | null;
}

export interface OwnerState {
  /** Jobs of this person running now. */
  running: number;
  /** When this person's last job started (ms since the epoch); null when none ever did. */
  lastStartedAt: number | null;
}

/** The next job to start among `queued` (oldest first), or null when none waits. */
export function nextFairJob(queued: readonly QueuedJob[], owners: ReadonlyMap<number | null, OwnerState>): QueuedJob | null {
  let best: QueuedJob | null = null;
  let bestState: OwnerState | null = null;
  const seen = new Set<number | null>();
  for (const job of queued) {
    // Only each person's oldest queued job competes; the queue is in order, so that is the first one seen.
    if (seen.has(job.owner)) continue;
    seen.add(job.owner);
    const state = owners.get(job.owner) ?? { running: 0, lastStartedAt: null };
    if (bestState === null || comesFirst(state, bestState)) {
      best = job;
      bestState = state;
    }
  }
  return best;
}

/** Whether a person in state `a` goes before one in state `b` (ties keep queue order). */
function comesFirst(a: OwnerState, b: OwnerState): boolean {
  if (a.running !== b.running) return a.running < b.running;
  const aStarted = a.lastStartedAt ?? -Infinity;
  const bStarted = b.lastStartedAt ?? -Infinity;
  return aStarted < bStarted;
}
