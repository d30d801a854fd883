// Plane geometry of regions: polygons in plane coordinates, their area (shoelace formula), whether two of their
// edges cross, and the part of a polygon inside an axis-aligned rectangle (Sutherland–Hodgman clipping against the
// rectangle's four sides; the rectangle is convex, so the clipped area is right for concave polygons too).

export type Point = readonly [number, number];

/** Signed area (positive for counter-clockwise points). */
export function signedArea(points: readonly Point[]): number {
  let twice = 0;
  for (let i = 0; i < points.length; i++) {
    const [x1, y1] = points[i];
    const [x2, y2] = points[(i + 1) % points.length];
    twice += x1 * y2 - x2 * y1;
  }
  return twice / 2;
}

function orientation(a: Point, b: Point, c: Point): number {
  const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  return cross > 0 ? 1 : cross < 0 ? -1 : 0;
}

function onSegment(a: Point, b: Point, p: Point): boolean {
  return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
}

/** Whether segments ab and cd share a point (touching counts). */
function segmentsMeet(a: Point, b: Point, c: Point, d: Point): boolean {
  const o1 = orientation(a, b, c);
  const o2 = orientation(a, b, d);
  const o3 = orientation(c, d, a);
  const o4 = orientation(c, d, b);
  if (o1 !== o2 && o3 !== o4) return true;
  return (o1 === 0 && onSegment(a, b, c)) || (o2 === 0 && onSegment(a, b, d)) || (o3 === 0 && onSegment(c, d, a)) || (o4 === 0 && onSegment(c, d, b));
}

/**
 * The first pair of edges (by index; edge i joins point i to point i + 1) that meet other than at the corner two
 * neighbouring edges share, or null for a simple polygon. O(n²): polygons are drawn by hand and have few points.
 */
export function firstCrossing(points: readonly Point[]): [number, number] | null {
  const n = points.length;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const neighbours = j === i + 1 || (i === 0 && j === n - 1);
      const [a, b, c, d] = [points[i], points[(i + 1) % n], points[j], points[(j + 1) % n]];
      if (neighbours) {
        // Neighbours share one corner; they may not fold back along each other.
        const shared = j === i + 1 ? b : a;
        const [p, q] = j === i + 1 ? [a, d] : [b, c];
        if (orientation(p, shared, q) === 0 && onSegment(p, q, shared) === false) return [i, j];
        continue;
      }
      if (segmentsMeet(a, b, c, d)) return [i, j];
    }
  }
  return null;
}

/** The part of the polygon inside the rectangle [x1, x2] × [y1, y2] (possibly with zero-area slivers). */
export function clipToRectangle(points: readonly Point[], x1: number, x2: number, y1: number, y2: number): Point[] {
  type Side = { inside: (p: Point) => boolean; cut: (p: Point, q: Point) => Point };
  const atX = (x: number) => (p: Point, q: Point): Point => [x, p[1] + ((q[1] - p[1]) * (x - p[0])) / (q[0] - p[0])];
  const atY = (y: number) => (p: Point, q: Point): Point => [p[0] + ((q[0] - p[0]) * (y - p[1])) / (q[1] - p[1]), y];
  const sides: Side[] = [
    { inside: (p) => p[0] >= x1, cut: atX(x1) },
    { inside: (p) => p[0] <= x2, cut: atX(x2) },
    { inside: (p) => p[1] >= y1, cut: atY(y1) },
    { inside: (p) => p[1] <= y2, cut: atY(y2) },
  ];
  let output: Point[] = [...points];
  for (const side of sides) {
    const input = output;
    output = [];
    for (let i = 0; i < input.length; i++) {
      const current = input[i];
      const previous = input[(i + input.length - 1) % input.length];
      if (side.inside(current)) {
        if (!side.inside(previous)) output.push(side.cut(previous, current));
        output.push(current);
      } else if (side.inside(previous)) {
        output.push(side.cut(previous, current));
      }
    }
    if (output.length === 0) break;
  }
  return output;
}

/** Area of the polygon inside the rectangle. */
export function areaInRectangle(points: readonly Point[], x1: number, x2: number, y1: number, y2: number): number {
  const clipped = clipToRectangle(points, x1, x2, y1, y2);
  return clipped.length < 3 ? 0 : Math.abs(signedArea(clipped));
}
