'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef, useState } from 'react';
import type { PlaneView } from '@/lib/samples/shapes';
import { AXIS_LABELS, DENSITY_LABEL } from './plane-view-settings';

/** Our colour map: a perceptually uniform ramp from Plot's built-ins, readable in grey and by colour-blind readers. */
const COLOUR_SCHEME = 'cividis';

/** The figure's width follows its box; the height keeps a 4:3 shape within limits. */
function useBoxWidth() {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const element = box.current;
    if (!element) return;
    const observer = new ResizeObserver(([entry]) => setWidth(Math.floor(entry.contentRect.width)));
    observer.observe(element);
    return () => observer.disconnect();
  }, []);
  return { box, width };
}

/**
 * A density map as an Observable Plot raster over the server's uniform grid (STACK.md pitfall 5: in the browser,
 * with the grid's size and corners given). Empty bins stay transparent so that they differ from small densities.
 */
export function DensityFigure({ map, collision = 'hadron' }: { map: PlaneView; collision?: 'hadron' | 'ee' }) {
  const { box, width } = useBoxWidth();
  const holder = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const target = holder.current;
    if (!target || width === 0) return;
    const nx = map.xEdges.length - 1;
    const ny = map.yEdges.length - 1;
    const values = map.density.map((value) => (value > 0 ? value : NaN));
    const largest = map.density.reduce((top, value) => Math.max(top, value), 0);
    const figure = Plot.plot({
      width,
      height: Math.round(Math.min(560, Math.max(280, width * 0.72))),
      marginLeft: 48,
      marginBottom: 42,
      style: { fontSize: '12px' },
      x: { domain: [map.xEdges[0], map.xEdges[nx]], label: AXIS_LABELS[collision].horizontal[map.horizontal], labelAnchor: 'center', labelArrow: 'none' },
      y: { domain: [map.yEdges[0], map.yEdges[ny]], label: AXIS_LABELS[collision].vertical, labelAnchor: 'center', labelArrow: 'none' },
      color: {
        type: 'linear',
        scheme: COLOUR_SCHEME,
        domain: [0, largest || 1],
        legend: true,
        label: DENSITY_LABEL,
      },
      marks: [
        Plot.raster(values, {
          width: nx,
          height: ny,
          x1: map.xEdges[0],
          x2: map.xEdges[nx],
          y1: map.yEdges[0],
          y2: map.yEdges[ny],
          imageRendering: 'pixelated',
        }),
        Plot.frame({ strokeOpacity: 0.25 }),
      ],
    });
    target.replaceChildren(figure);
    return () => figure.remove();
  }, [map, width, collision]);

  return (
    <div ref={box} className="w-full">
      <div ref={holder} />
    </div>
  );
}
