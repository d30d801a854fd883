'use client';

import { useEffect, useRef } from 'react';
import { useBoxWidth } from '../plane/use-box-width';

/** Holds an Observable Plot chart made for the holder's width, redrawn when `draw` changes. */
export function PlotHolder({ draw, label }: { draw: (width: number) => Element; label: string }) {
  const { box, width } = useBoxWidth();
  const holder = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!holder.current || width === 0) return;
    const chart = draw(width);
    holder.current.replaceChildren(chart);
    return () => chart.remove();
  }, [draw, width]);
  return (
    <div ref={box} role="figure" aria-label={label}>
      <div ref={holder} />
    </div>
  );
}
