// The query string of the separation route: ?signal=ID&background=ID&view=<JSON view settings>&minEntries=N.
import { z } from 'zod';
import { viewParam } from '@/lib/maps/queries';

const sampleId = (name: string) =>
  z
    .string({ error: `${name} is required: a sample id` })
    .regex(/^[1-9]\d{0,14}$/, `${name} must be a sample id`)
    .transform(Number);

export const separationQuery = z
  .strictObject({
    signal: sampleId('signal'),
    background: sampleId('background'),
    view: viewParam,
    minEntries: z
      .string()
      .regex(/^\d{1,9}$/, 'minEntries must be a whole number')
      .transform(Number)
      .default(() => 10),
  })
  .refine((q) => q.signal !== q.background, { error: 'background must differ from signal', path: ['background'] });

export type SeparationQuery = z.output<typeof separationQuery>;
