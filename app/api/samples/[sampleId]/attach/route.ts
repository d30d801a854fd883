import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { idParam } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { attachSample } from '@/lib/samples/attach';
import { sampleNameSchema } from '@/lib/samples/upload-fields';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const attachSchema = z.strictObject({
  studyId: z.number({ error: 'studyId is required: the study to add the sample to' }).int().positive(),
  name: sampleNameSchema.optional(),
});

/** Adds a done sample to another study on the same stored tables (viewer of the sample, editor of the study). */
export const POST = signedInRoute({ params: z.object({ sampleId: idParam }) }, async ({ request, params, user }) => {
  const input = await readJsonBody(request, attachSchema, BODY_LIMITS.account);
  return json({ sample: await attachSample(user, params.sampleId, input) }, 201);
});
