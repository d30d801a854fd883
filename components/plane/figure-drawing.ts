// Drawing on a plane figure with the pointer, in plane coordinates: a rectangle by dragging, or a polygon by
// clicking its corners (double-click, Enter or a click on the first corner closes it; Backspace removes the last
// corner; Escape drops it). The corners drawn so far are shown as a line inside the figure's SVG.
import type { RegionShape } from '@/lib/physics/plane/region';

export type DrawMode = 'rectangle' | 'polygon';

interface Scale {
  apply(value: number): number;
  invert?(value: number): unknown;
}

export interface DragBox {
  left: number;
  top: number;
  width: number;
  height: number;
}

interface DrawingOptions {
  svg: SVGSVGElement;
  holder: HTMLElement;
  x: Scale;
  y: Scale;
  mode: () => DrawMode | null;
  /** A finished shape. */
  onShape: (shape: RegionShape) => void;
  /** The rectangle being dragged, in pixels of the holder (null when none). */
  onDragging: (box: DragBox | null) => void;
}

/** A click this close (pixels) to the first corner closes the polygon. */
const CLOSE_RADIUS = 8;

/** Listens for drawing on the figure's SVG; returns what stops listening. */
export function attachDrawing({ svg, holder, x, y, mode, onShape, onDragging }: DrawingOptions): () => void {
  let start: { x: number; y: number } | null = null;
  let corners: Array<[number, number]> = [];
  const trace = document.createElementNS('http://www.w3.org/2000/svg', 'polyline');
  trace.setAttribute('fill', 'rgba(15, 118, 110, 0.12)');
  trace.setAttribute('stroke', '#0f766e');
  trace.setAttribute('stroke-width', '2');
  trace.setAttribute('stroke-dasharray', '4 2');
  trace.setAttribute('data-testid', 'polygon-trace');
  svg.appendChild(trace);

  const pixel = (event: PointerEvent | MouseEvent) => {
    const rect = svg.getBoundingClientRect();
    const outer = holder.getBoundingClientRect();
    return { x: event.clientX - rect.left, y: event.clientY - rect.top, dx: rect.left - outer.left, dy: rect.top - outer.top };
  };
  const toPlane = (p: { x: number; y: number }): [number, number] => [x.invert!(p.x) as number, y.invert!(p.y) as number];
  const redraw = () => trace.setAttribute('points', corners.map(([u, v]) => `${x.apply(u)},${y.apply(v)}`).join(' '));
  const finishPolygon = () => {
    if (corners.length >= 3) onShape({ type: 'polygon', points: corners });
    corners = [];
    redraw();
  };

  const onPlot = (event: Event) => event.target instanceof Node && svg.contains(event.target);
  const down = (event: PointerEvent) => {
    if (mode() === null || !onPlot(event)) return;
    // Plot's own pointer would pin its tooltip on this press (and stops other listeners on the SVG from hearing it).
    event.stopPropagation();
    if (mode() !== 'rectangle') return;
    start = pixel(event);
    svg.setPointerCapture(event.pointerId);
  };
  const move = (event: PointerEvent) => {
    if (!start) return;
    const p = pixel(event);
    onDragging({ left: Math.min(start.x, p.x) + p.dx, top: Math.min(start.y, p.y) + p.dy, width: Math.abs(p.x - start.x), height: Math.abs(p.y - start.y) });
  };
  const up = (event: PointerEvent) => {
    if (!start) return;
    const [u1, v1] = toPlane(start);
    const [u2, v2] = toPlane(pixel(event));
    start = null;
    onDragging(null);
    const shape = { type: 'rectangle' as const, x1: Math.min(u1, u2), x2: Math.max(u1, u2), y1: Math.min(v1, v2), y2: Math.max(v1, v2) };
    if (shape.x2 > shape.x1 && shape.y2 > shape.y1) onShape(shape);
  };
  const click = (event: MouseEvent) => {
    if (mode() !== 'polygon' || !onPlot(event)) return;
    const p = pixel(event);
    if (corners.length >= 3) {
      const [fx, fy] = [x.apply(corners[0][0]), y.apply(corners[0][1])];
      if (Math.hypot(fx - p.x, fy - p.y) <= CLOSE_RADIUS) return finishPolygon();
    }
    corners = [...corners, toPlane(p)];
    redraw();
  };
  const doubleClick = (event: MouseEvent) => {
    if (mode() !== 'polygon' || !onPlot(event)) return;
    event.preventDefault();
    // The double-click's two clicks each added a corner at the same place: keep one.
    const last = corners[corners.length - 1];
    const before = corners[corners.length - 2];
    if (last && before && last[0] === before[0] && last[1] === before[1]) corners = corners.slice(0, -1);
    finishPolygon();
  };
  const key = (event: KeyboardEvent) => {
    if (mode() !== 'polygon' || corners.length === 0) return;
    if (event.key === 'Enter') finishPolygon();
    else if (event.key === 'Escape') corners = [];
    else if (event.key === 'Backspace') corners = corners.slice(0, -1);
    else return;
    event.preventDefault();
    redraw();
  };
  // Heard on the holder while capturing, before Plot's listeners on the SVG.
  holder.addEventListener('pointerdown', down, true);
  svg.addEventListener('pointermove', move);
  svg.addEventListener('pointerup', up);
  holder.addEventListener('click', click, true);
  holder.addEventListener('dblclick', doubleClick, true);
  window.addEventListener('keydown', key);
  return () => {
    holder.removeEventListener('pointerdown', down, true);
    holder.removeEventListener('click', click, true);
    holder.removeEventListener('dblclick', doubleClick, true);
    window.removeEventListener('keydown', key);
    trace.remove();
  };
}
