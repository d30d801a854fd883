'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef, useState } from 'react';
import type { EdgeLine } from '@/lib/physics/plane/edges';
import type { ContourLine } from './contour-lines';
import { type ColourScale, plotColour } from './colour-scale';
import { useBoxWidth } from './use-box-width';
import { formatValue, formatWithError } from './value-format';

/** A binned plane to draw: `values[iy * nx + ix]`; null where a value is not defined (masked, empty reference). */
export interface FigureGrid {
  xEdges: number[];
  yEdges: number[];
  values: Array<number | null>;
  errors?: Array<number | null>;
  counts?: number[] | null;
  /** 1 where a bin is masked (drawn hatched grey, not coloured). */
  masked?: number[];
}

/** A rectangle in plane coordinates. */
export interface FigureBox {
  x1: number;
  x2: number;
  y1: number;
  y2: number;
}

/** Contour lines over the figure (contour-lines.ts), with a name for the figure's description. */
export interface FigureContours {
  lines: ContourLine[];
  label: string;
}

export interface HoverBin {
  x: [number, number];
  y: [number, number];
  value: number | null;
  error: number | null;
  count: number | null;
}

interface Bin extends HoverBin {
  xc: number;
  yc: number;
  masked: boolean;
}

interface PlaneFigureProps {
  grid: FigureGrid;
  colour: ColourScale;
  xLabel: string;
  yLabel: string;
  /** What a value is, for the hover readout ("ρ", "ratio", …). */
  valueName: string;
  lines?: EdgeLine[];
  contours?: FigureContours | null;
  box?: FigureBox | null;
  /** Labelled rectangles drawn over the figure (e.g. ranked region proposals). */
  regions?: Array<FigureBox & { label: string }>;
  /** When set, dragging on the figure draws a box and reports it. */
  onBox?: (box: FigureBox) => void;
  legend?: boolean;
  /** Height over width. */
  aspect?: number;
  /** Small multiples: no readout line, smaller type. */
  compact?: boolean;
  title?: string;
  /** Receives the figure element (for exports). */
  figureRef?: (figure: Element | null) => void;
}

const LINE_STYLES: Record<EdgeLine['kind'], { stroke: string; strokeDasharray?: string }> = {
  radius: { stroke: '#1d2733' },
  zHalf: { stroke: '#1d2733', strokeDasharray: '6 3' },
  constantZ: { stroke: '#4a5868', strokeDasharray: '2 3' },
  ktOneGeV: { stroke: '#0b5953', strokeDasharray: '8 3 2 3' },
};

function binsOf(grid: FigureGrid): Bin[] {
  const nx = grid.xEdges.length - 1;
  const ny = grid.yEdges.length - 1;
  const bins: Bin[] = [];
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const i = iy * nx + ix;
      const x: [number, number] = [grid.xEdges[ix], grid.xEdges[ix + 1]];
      const y: [number, number] = [grid.yEdges[iy], grid.yEdges[iy + 1]];
      bins.push({
        x,
        y,
        xc: (x[0] + x[1]) / 2,
        yc: (y[0] + y[1]) / 2,
        value: grid.values[i],
        error: grid.errors?.[i] ?? null,
        count: grid.counts?.[i] ?? null,
        masked: grid.masked?.[i] === 1,
      });
    }
  }
  return bins;
}

function drawable(bin: Bin, colour: ColourScale): boolean {
  if (bin.masked || bin.value === null || !Number.isFinite(bin.value)) return false;
  // Empty bins stay blank (they differ from small densities); a log scale cannot show values ≤ 0 at all.
  if (colour.scheme === 'ember') return bin.value > 0;
  return colour.type !== 'log' || bin.value > 0;
}

/** Hover and readout text of a bin. */
export function describeBin(bin: HoverBin, xLabel: string, yLabel: string, valueName: string): string {
  const range = (r: [number, number]) => `${formatValue(r[0])} to ${formatValue(r[1])}`;
  const count = bin.count === null ? '' : `, ${bin.count} splitting${bin.count === 1 ? '' : 's'}`;
  return `${xLabel} ${range(bin.x)}, ${yLabel} ${range(bin.y)}: ${valueName} = ${formatWithError(bin.value, bin.error)}${count}`;
}

/**
 * A binned plane drawn with Observable Plot: one rectangle a bin coloured with a house scheme and a legend, the
 * kinematic lines and leading-order contours over it, a box, and a readout of the bin under the pointer (edges,
 * value ± error, raw count). Dragging draws a box when `onBox` is given.
 */
export function PlaneFigure(props: PlaneFigureProps) {
  const { grid, colour, xLabel, yLabel, valueName, lines = [], contours, box, regions, onBox, legend = true, aspect = 0.72, compact = false, title, figureRef } = props;
  const { box: holderBox, width } = useBoxWidth();
  const holder = useRef<HTMLDivElement>(null);
  const [hover, setHover] = useState<HoverBin | null>(null);
  /** The box being dragged, in pixels of the holder (drawn as an overlay, so the figure is not redrawn meanwhile). */
  const [dragging, setDragging] = useState<{ left: number; top: number; width: number; height: number } | null>(null);
  const onBoxRef = useRef(onBox);
  onBoxRef.current = onBox;

  useEffect(() => {
    const target = holder.current;
    if (!target || width === 0) return;
    const nx = grid.xEdges.length - 1;
    const ny = grid.yEdges.length - 1;
    const domainX: [number, number] = [grid.xEdges[0], grid.xEdges[nx]];
    const domainY: [number, number] = [grid.yEdges[0], grid.yEdges[ny]];
    const bins = binsOf(grid);
    const marks: Plot.Markish[] = [
      Plot.rect(bins.filter((bin) => bin.masked), { x1: (d: Bin) => d.x[0], x2: (d: Bin) => d.x[1], y1: (d: Bin) => d.y[0], y2: (d: Bin) => d.y[1], fill: '#e3e1da', inset: 0, shapeRendering: 'crispEdges' }),
      Plot.rect(bins.filter((bin) => drawable(bin, colour)), { x1: (d: Bin) => d.x[0], x2: (d: Bin) => d.x[1], y1: (d: Bin) => d.y[0], y2: (d: Bin) => d.y[1], fill: (d: Bin) => d.value, inset: 0, shapeRendering: 'crispEdges' }),
    ];
    if (contours) {
      const points = contours.lines.flatMap((line) => line.points.map(([u, v]) => ({ u, v, id: line.id })));
      marks.push(Plot.line(points, { x: 'u', y: 'v', z: 'id', stroke: '#0b5953', strokeWidth: 1.2, ariaDescription: 'expectation contours' }));
    }
    for (const line of lines) {
      if (line.points.length < 2) continue;
      marks.push(Plot.line(line.points, { x: (p: [number, number]) => p[0], y: (p: [number, number]) => p[1], strokeWidth: 1.2, ...LINE_STYLES[line.kind], ariaDescription: line.kind }));
    }
    if (box) {
      marks.push(Plot.rect([box], { x1: 'x1', x2: 'x2', y1: 'y1', y2: 'y2', fill: 'none', stroke: '#0f766e', strokeWidth: 2, ariaDescription: 'box' }));
    }
    if (regions && regions.length > 0) {
      marks.push(
        Plot.rect(regions, { x1: 'x1', x2: 'x2', y1: 'y1', y2: 'y2', fill: 'none', stroke: '#1d2733', strokeWidth: 1.6, ariaDescription: 'regions' }),
        Plot.text(regions, { x: 'x1', y: 'y2', text: 'label', dx: 3, dy: 7, textAnchor: 'start', fontWeight: 600, fill: '#1d2733', stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
      );
    }
    marks.push(
      Plot.frame({ strokeOpacity: 0.25 }),
      Plot.tip(bins, Plot.pointer({ x: 'xc', y: 'yc', title: (d: Bin) => describeBin(d, xLabel, yLabel, valueName), maxRadius: 400 })),
    );
    const figure = Plot.plot({
      width,
      height: Math.round(Math.min(620, Math.max(compact ? 160 : 260, width * aspect))),
      marginLeft: compact ? 40 : 52,
      marginBottom: compact ? 34 : 42,
      marginRight: 12,
      style: { fontSize: compact ? '10px' : '12px', background: 'transparent' },
      title,
      clip: true,
      x: { domain: domainX, label: xLabel, labelAnchor: 'center', labelArrow: 'none' },
      y: { domain: domainY, label: yLabel, labelAnchor: 'center', labelArrow: 'none' },
      color: plotColour(colour, legend),
      marks,
    });
    const readout = () => {
      const value = (figure as unknown as { value: Bin | null }).value;
      setHover(value ? { x: value.x, y: value.y, value: value.value, error: value.error, count: value.count } : null);
    };
    figure.addEventListener('input', readout);
    const svg = [...figure.querySelectorAll('svg')].pop() ?? null;
    const xScale = figure.scale('x');
    const yScale = figure.scale('y');
    let start: { x: number; y: number } | null = null;
    const pixel = (event: PointerEvent) => {
      const rect = svg!.getBoundingClientRect();
      const outer = target.getBoundingClientRect();
      return { x: event.clientX - rect.left, y: event.clientY - rect.top, dx: rect.left - outer.left, dy: rect.top - outer.top };
    };
    const down = (event: PointerEvent) => {
      if (!onBoxRef.current) return;
      start = pixel(event);
      svg!.setPointerCapture(event.pointerId);
    };
    const move = (event: PointerEvent) => {
      if (!start) return;
      const p = pixel(event);
      setDragging({ left: Math.min(start.x, p.x) + p.dx, top: Math.min(start.y, p.y) + p.dy, width: Math.abs(p.x - start.x), height: Math.abs(p.y - start.y) });
    };
    const up = (event: PointerEvent) => {
      if (!start) return;
      const p = pixel(event);
      const xs = [start.x, p.x].map((v) => xScale!.invert!(v) as number);
      const ys = [start.y, p.y].map((v) => yScale!.invert!(v) as number);
      start = null;
      setDragging(null);
      const drawn = { x1: Math.min(...xs), x2: Math.max(...xs), y1: Math.min(...ys), y2: Math.max(...ys) };
      if (drawn.x2 > drawn.x1 && drawn.y2 > drawn.y1) onBoxRef.current?.(drawn);
    };
    if (svg) {
      svg.addEventListener('pointerdown', down);
      svg.addEventListener('pointermove', move);
      svg.addEventListener('pointerup', up);
      if (onBox) svg.style.cursor = 'crosshair';
    }
    target.replaceChildren(figure);
    figureRef?.(figure);
    return () => {
      figure.removeEventListener('input', readout);
      figure.remove();
      figureRef?.(null);
    };
    // onBox is read through a ref; only whether there is one changes the figure (its cursor).
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [grid, colour, xLabel, yLabel, valueName, lines, contours, box, regions, legend, aspect, compact, title, width, figureRef, onBox !== undefined]);

  return (
    <div ref={holderBox} className="w-full">
      <div className="relative">
        <div ref={holder} />
        {dragging && <div aria-hidden className="pointer-events-none absolute border-2 border-accent bg-accent/10" style={dragging} />}
      </div>
      {!compact && (
        <p aria-live="polite" data-testid="bin-readout" className="mt-1 min-h-5 font-mono text-xs text-ink-soft">
          {hover ? describeBin(hover, xLabel, yLabel, valueName) : 'Point at a bin to read its value.'}
        </p>
      )}
    </div>
  );
}
