// The samples a contrast or projection names, each checked like a single sample: a sample the caller may not see
// answers 404, as one that does not exist.
import type { User } from '@/models/user';
import { type LoadedSample, sampleAccess } from '@/lib/samples/access';

export async function viewSamples(user: User, ids: number[]): Promise<LoadedSample[]> {
  const samples: LoadedSample[] = [];
  for (const id of ids) samples.push((await sampleAccess(user, id, 'viewer')).sample);
  return samples;
}
