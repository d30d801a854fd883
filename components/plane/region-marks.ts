// Regions drawn over a plane figure: each outline in its category's colour over a pale halo (dashed once resolved),
// its title beside it, the selected one thicker.
import * as Plot from '@observablehq/plot';
import { outline, type RegionShape } from '@/lib/physics/plane/region';

export interface FigureRegion {
  id: number;
  title: string;
  shape: RegionShape;
  colour: string;
  resolved: boolean;
  selected: boolean;
}

export function regionMarks(regions: readonly FigureRegion[]): Plot.Markish[] {
  return regions.flatMap((region) => {
    const points = outline(region.shape);
    const closed = [...points, points[0]];
    const top = points.reduce((best, p) => (p[1] > best[1] || (p[1] === best[1] && p[0] < best[0]) ? p : best), points[0]);
    const path = { x: (p: [number, number]) => p[0], y: (p: [number, number]) => p[1] };
    return [
      // A pale halo under the outline keeps it visible on dark and light bins alike.
      Plot.line(closed, { ...path, stroke: 'white', strokeOpacity: 0.8, strokeWidth: region.selected ? 5.5 : 4 }),
      Plot.line(closed, {
        ...path,
        stroke: region.colour,
        strokeWidth: region.selected ? 3 : 1.8,
        strokeDasharray: region.resolved ? '5 3' : undefined,
        ariaDescription: `region ${region.title}`,
      }),
      Plot.text([top], {
        x: (p: [number, number]) => p[0],
        y: (p: [number, number]) => p[1],
        text: () => region.title,
        dy: -7,
        textAnchor: 'start',
        fill: region.colour,
        stroke: 'white',
        strokeWidth: 3,
        paintOrder: 'stroke',
        fontWeight: region.selected ? 'bold' : 'normal',
      }),
    ];
  });
}
