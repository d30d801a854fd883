import { z } from 'zod';
import { json, noContent, signedInRoute } from '@/lib/api/route-handlers';
import { idParam } from '@/lib/api/schemas';
import { readQuery } from '@/lib/api/validation';
import { sampleAccess } from '@/lib/samples/access';
import { jobEndOrTimeout, takeWaitPlace } from '@/lib/samples/job-ends';
import { wholeNumberParam } from '@/lib/samples/query-params';
import { deleteSample, isUnfinished } from '@/lib/samples/removal';
import { sampleDetail } from '@/lib/samples/views';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const params = z.object({ sampleId: idParam });

/** Longest wait a request may ask for, in seconds (below the usual proxy and client time-outs). */
const MAX_WAIT_SECONDS = 60;
/** While waiting, the sample is read again this often (an end recorded by another server process is seen then). */
const RECHECK_MS = 1000;

const query = z.object({ wait: wholeNumberParam('wait', 0, MAX_WAIT_SECONDS).optional() });

/**
 * The sample. With `wait=N` (seconds), a queued or running sample is answered when its job ends or after N
 * seconds, whichever comes first: a script waits with one request instead of polling. A person holds at most
 * MAX_WAITS_PER_USER such requests at once; more are answered at once.
 */
export const GET = signedInRoute({ params }, async ({ request, params, user }) => {
  const { wait = 0 } = readQuery(request, query);
  const deadline = Date.now() + wait * 1000;
  let { sample, myRole } = await sampleAccess(user, params.sampleId, 'viewer');
  const release = wait > 0 && isUnfinished(sample) ? takeWaitPlace(user.id) : null;
  try {
    while (release && isUnfinished(sample) && Date.now() < deadline && !request.signal.aborted) {
      await jobEndOrTimeout(sample.id, Math.min(RECHECK_MS, deadline - Date.now()), request.signal);
      // Read again with the access check: the sample may be gone, or the user no longer a member.
      ({ sample, myRole } = await sampleAccess(user, params.sampleId, 'viewer'));
    }
  } finally {
    release?.();
  }
  return json({ sample: sampleDetail(sample, myRole) });
});

/** Deletes the sample with its files; a job still to finish is cancelled first. */
export const DELETE = signedInRoute({ params }, async ({ params, user }) => {
  const { sample } = await sampleAccess(user, params.sampleId, 'editor');
  await deleteSample(sample);
  return noContent();
});
