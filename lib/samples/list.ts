// GET /api/samples: the samples of the studies the user can see, filtered and sorted as the query asks.
import { Op, type Order, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { idParam } from '@/lib/api/schemas';
import { db } from '@/lib/db/connection';
import type { Sample } from '@/models/sample';
import type { User } from '@/models/user';
import { SAMPLE_STATES } from '@/models/vocabulary';
import { sampleIncludes, visibleStudyIds, type LoadedSample } from './access';
import { orderParam } from './query-params';
import type { SampleSummary } from './shapes';
import { sampleSummary } from './views';

const SORTS = { createdAt: 'id', name: 'name', label: 'label', state: 'state', fileSize: 'fileSize' } as const;

export const sampleListQuery = z.strictObject({
  studyId: idParam.optional(),
  label: z.string().optional(),
  tag: z.string().optional(),
  state: z.enum(SAMPLE_STATES, { error: `state must be one of: ${SAMPLE_STATES.join(', ')}` }).optional(),
  sort: z
    .enum(Object.keys(SORTS) as [keyof typeof SORTS], { error: `sort must be one of: ${Object.keys(SORTS).join(', ')}` })
    .default('createdAt'),
  /** Default: newest and largest first, names A to Z. */
  order: orderParam.optional(),
});

export type SampleListQuery = z.output<typeof sampleListQuery>;

export async function visibleSamples(user: User, query: SampleListQuery): Promise<SampleSummary[]> {
  const { sequelize, models } = db();
  const visible = await visibleStudyIds(user);
  const conditions: WhereOptions<Sample>[] = [];
  if (visible !== 'all') conditions.push({ studyId: { [Op.in]: visible } });
  if (query.studyId !== undefined) conditions.push({ studyId: query.studyId });
  if (query.label !== undefined) conditions.push({ label: query.label });
  if (query.state !== undefined) conditions.push({ state: query.state });
  if (query.tag !== undefined) {
    const tagged = `(SELECT s.id FROM samples s, json_each(s.tags) t WHERE t.value = ${sequelize.escape(query.tag)})`;
    conditions.push({ id: { [Op.in]: sequelize.literal(tagged) } });
  }
  const direction = query.order ?? (query.sort === 'createdAt' || query.sort === 'fileSize' ? 'desc' : 'asc');
  const order: Order = [[SORTS[query.sort], direction.toUpperCase()], ['id', 'DESC']];
  const samples = (await models.Sample.findAll({
    where: { [Op.and]: conditions },
    include: sampleIncludes(),
    order,
  })) as LoadedSample[];
  return samples.map(sampleSummary);
}
