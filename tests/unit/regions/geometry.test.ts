// Region geometry input (lib/regions/geometry-schema.ts) and the polygon helpers under it.
import { describe, expect, it } from 'vitest';
import { clipToRectangle, firstCrossing, signedArea } from '@/lib/physics/plane/polygon';
import { axesKey, axesOfView, regionGeometrySchema } from '@/lib/regions/geometry-schema';
import { mentionedIds, mentionText } from '@/lib/regions/mentions';

const axes = { x: 'lnInvDelta', y: 'lnKt' };
const messages = (value: unknown) => {
  const parsed = regionGeometrySchema.safeParse(value);
  return parsed.success ? [] : parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
};

describe('region geometry', () => {
  it('accepts a rectangle (corners put in order) and a simple concave polygon', () => {
    expect(regionGeometrySchema.parse({ axes, shape: { type: 'rectangle', x1: 3, x2: 1, y1: 0.5, y2: -1 } }).shape).toEqual({ type: 'rectangle', x1: 1, x2: 3, y1: -1, y2: 0.5 });
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [4, 0], [2, 1], [4, 4], [0, 4]] } })).toEqual([]);
  });

  it('refuses fewer than three points, crossing edges, repeated points and folded or flat polygons', () => {
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [1, 1]] } })).toEqual(['shape.points: A polygon needs at least 3 points']);
    // A bow tie: edge 0 ((0,0)→(2,2)) crosses edge 2 ((2,0)→(0,2)).
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [2, 2], [2, 0], [0, 2]] } })).toEqual(['shape.points: The polygon crosses itself: edge 0 meets edge 2']);
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [1, 0], [1, 0], [0, 1]] } })[0]).toMatch(/Points 1 and 2 are the same point/);
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [1, 0], [2, 0]] } })).toHaveLength(1);
    expect(messages({ axes, shape: { type: 'rectangle', x1: 1, x2: 1, y1: 0, y2: 1 } })).toEqual(['shape.x2: The rectangle needs a width: x1 and x2 must differ']);
  });

  it('refuses coordinates that are not finite numbers, and unknown axes', () => {
    expect(messages({ axes, shape: { type: 'rectangle', x1: 0, x2: Infinity, y1: 0, y2: 1 } })).toEqual(['shape.x2: x2 must be a finite number']);
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], [1, Number.NaN], [0, 1]] } })).toEqual(['shape.points.1.1: y must be a finite number']);
    expect(messages({ axes, shape: { type: 'polygon', points: [[0, 0], ['1', 0], [0, 1]] } })).toEqual(['shape.points.1.0: x must be a finite number']);
    expect(messages({ axes: { x: 'lnKt', y: 'lnKt' }, shape: { type: 'rectangle', x1: 0, x2: 1, y1: 0, y2: 1 } })[0]).toMatch(/^axes.x: axes.x must be one of/);
  });

  it('matches a view by its variables, and by log binning only where it changes the coordinate', () => {
    const view = { x: { variable: 'lnInvDelta', log: true }, y: { variable: 'z', log: true } } as const;
    expect(axesOfView(view)).toEqual({ x: 'lnInvDelta', y: 'z', yLog: true });
    expect(axesKey(axesOfView(view))).toBe('lnInvDelta,z:log');
    expect(axesKey({ x: 'lnInvDelta', y: 'z' })).not.toBe(axesKey(axesOfView(view)));
  });
});

describe('polygon helpers', () => {
  it('clip a concave polygon to a rectangle with the right area', () => {
    // A U shape: the 4 × 3 block minus the 2 × 2 notch from the top middle; area 12 − 4 = 8.
    const u: Array<[number, number]> = [[0, 0], [4, 0], [4, 3], [3, 3], [3, 1], [1, 1], [1, 3], [0, 3]];
    expect(signedArea(u)).toBe(8);
    expect(Math.abs(signedArea(clipToRectangle(u, 0, 4, 1, 3)))).toBe(4); // the two arms above y = 1
    expect(firstCrossing(u)).toBeNull();
  });
});

describe('mentions', () => {
  it('finds each mentioned id once, and the text keeps a name with brackets whole', () => {
    const text = `${mentionText({ id: 4, name: 'Ada [Tallis]' })} and ${mentionText({ id: 9, name: 'Bo' })}, again ${mentionText({ id: 4, name: 'Ada' })}`;
    expect(text.startsWith('@[Ada Tallis](user:4)')).toBe(true);
    expect(mentionedIds(text)).toEqual([4, 9]);
    expect(mentionedIds('@someone, [x](user:5), @[y](user:0)')).toEqual([]);
  });
});
