// The zod schema of a region's geometry (lib/physics/plane/region.ts): coordinates finite, a rectangle of some
// width and height, a polygon of 3 to REGION_POLYGON_POINTS_MAX points that encloses an area and whose edges do
// not cross. Also decides on which views a region shows: those whose axes are the region's. Pages use it too.
import { z } from 'zod';
import { HORIZONTAL_VARIABLES, isLogBinned, type PlaneAxes, VERTICAL_VARIABLES } from '@/lib/physics/plane/axes';
import { firstCrossing } from '@/lib/physics/plane/polygon';
import type { RegionAxes, RegionGeometry } from '@/lib/physics/plane/region';
import { shapeArea } from '@/lib/physics/plane/region';
import { REGION_POLYGON_POINTS_MAX } from '@/models/vocabulary';

const coordinate = (what: string) =>
  z.number({ error: `${what} must be a finite number` }).refine(Number.isFinite, `${what} must be a finite number`);

const rectangleSchema = z
  .strictObject({
    type: z.literal('rectangle'),
    x1: coordinate('x1'),
    x2: coordinate('x2'),
    y1: coordinate('y1'),
    y2: coordinate('y2'),
  })
  .refine((r) => r.x1 !== r.x2, { error: 'The rectangle needs a width: x1 and x2 must differ', path: ['x2'] })
  .refine((r) => r.y1 !== r.y2, { error: 'The rectangle needs a height: y1 and y2 must differ', path: ['y2'] })
  .transform((r) => ({ type: 'rectangle' as const, x1: Math.min(r.x1, r.x2), x2: Math.max(r.x1, r.x2), y1: Math.min(r.y1, r.y2), y2: Math.max(r.y1, r.y2) }));

const pointSchema = z.tuple([coordinate('x'), coordinate('y')], { error: 'A point is [x, y]' });

const polygonSchema = z
  .strictObject({
    type: z.literal('polygon'),
    points: z
      .array(pointSchema, { error: 'points must be a list of [x, y] pairs' })
      .min(3, 'A polygon needs at least 3 points')
      .max(REGION_POLYGON_POINTS_MAX, `A polygon may have at most ${REGION_POLYGON_POINTS_MAX} points`),
  })
  .check((context) => {
    const points = context.value.points;
    const n = points.length;
    if (n < 3 || n > REGION_POLYGON_POINTS_MAX) return;
    for (let i = 0; i < n; i++) {
      const next = points[(i + 1) % n];
      if (points[i][0] === next[0] && points[i][1] === next[1]) {
        context.issues.push({ code: 'custom', message: `Points ${i} and ${(i + 1) % n} are the same point`, path: ['points', (i + 1) % n], input: context.value });
        return;
      }
    }
    const crossing = firstCrossing(points);
    if (crossing) {
      context.issues.push({ code: 'custom', message: `The polygon crosses itself: edge ${crossing[0]} meets edge ${crossing[1]}`, path: ['points'], input: context.value });
      return;
    }
    if (shapeArea(context.value) === 0) {
      context.issues.push({ code: 'custom', message: 'The polygon encloses no area', path: ['points'], input: context.value });
    }
  });

export const regionAxesSchema = z.strictObject({
  x: z.enum(HORIZONTAL_VARIABLES, { error: `axes.x must be one of ${HORIZONTAL_VARIABLES.join(', ')}` }),
  y: z.enum(VERTICAL_VARIABLES, { error: `axes.y must be one of ${VERTICAL_VARIABLES.join(', ')}` }),
  xLog: z.boolean({ error: 'axes.xLog must be true or false' }).optional(),
  yLog: z.boolean({ error: 'axes.yLog must be true or false' }).optional(),
});

export const regionGeometrySchema = z.strictObject({
  axes: regionAxesSchema.transform(canonicalAxes),
  shape: z.discriminatedUnion('type', [rectangleSchema, polygonSchema], { error: 'shape.type must be rectangle or polygon' }),
}) satisfies z.ZodType<RegionGeometry>;

/** The axes with the log flags kept only where they mean something (Δ, z, kt), so equal planes compare equal. */
export function canonicalAxes(axes: RegionAxes): RegionAxes {
  const xLog = isLogBinned({ variable: axes.x, log: axes.xLog ?? false });
  const yLog = isLogBinned({ variable: axes.y, log: axes.yLog ?? false });
  return { x: axes.x, y: axes.y, ...(xLog ? { xLog } : {}), ...(yLog ? { yLog } : {}) };
}

/** The region axes of a view's plane. */
export function axesOfView(view: PlaneAxes): RegionAxes {
  return canonicalAxes({ x: view.x.variable, y: view.y.variable, xLog: view.x.log, yLog: view.y.log });
}

/** A text naming the plane, equal for equal axes (a query parameter, a cache key). */
export function axesKey(axes: RegionAxes): string {
  const c = canonicalAxes(axes);
  return `${c.x}${c.xLog ? ':log' : ''},${c.y}${c.yLog ? ':log' : ''}`;
}
