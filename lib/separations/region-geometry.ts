// A region's shape in plane coordinates, as Regions (with discussion threads) store it: the two variables the
// coordinates are values of, and a rectangle in those variables' own values. A region proposal of a Separation is
// saved in this shape so that it can become a Region later.
import { z } from 'zod';
import { HORIZONTAL_VARIABLES, VERTICAL_VARIABLES } from '@/lib/physics/plane/axes';

const coordinate = (name: string) => z.number({ error: `${name} must be a number` }).refine(Number.isFinite, `${name} must be finite`);

export const regionGeometrySchema = z.strictObject({
  axes: z.strictObject({
    x: z.enum(HORIZONTAL_VARIABLES, { error: `axes.x must be one of ${HORIZONTAL_VARIABLES.join(', ')}` }),
    y: z.enum(VERTICAL_VARIABLES, { error: `axes.y must be one of ${VERTICAL_VARIABLES.join(', ')}` }),
  }),
  shape: z
    .strictObject({ type: z.literal('rectangle', { error: 'shape.type must be "rectangle"' }), x1: coordinate('shape.x1'), x2: coordinate('shape.x2'), y1: coordinate('shape.y1'), y2: coordinate('shape.y2') })
    .refine((s) => s.x2 > s.x1, { error: 'shape: x2 must be above x1', path: ['x2'] })
    .refine((s) => s.y2 > s.y1, { error: 'shape: y2 must be above y1', path: ['y2'] }),
});

export type RegionGeometry = z.output<typeof regionGeometrySchema>;
