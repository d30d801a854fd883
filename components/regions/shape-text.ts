// A region's shape in words and numbers, and typed coordinates read back into a shape (for keyboard users).
import type { RegionShape } from '@/lib/physics/plane/region';
import { formatValue } from '../plane/value-format';

export function describeShape(shape: RegionShape, xLabel: string, yLabel: string): string {
  if (shape.type === 'rectangle') {
    return `Rectangle: ${xLabel} ${formatValue(shape.x1)} to ${formatValue(shape.x2)}, ${yLabel} ${formatValue(shape.y1)} to ${formatValue(shape.y2)}`;
  }
  return `Polygon of ${shape.points.length} corners: ${shape.points.map(([x, y]) => `(${formatValue(x)}, ${formatValue(y)})`).join(' ')}`;
}

/** "x, y" pairs, one a line (or separated by ";"), as polygon points; null when a line is not two numbers. */
export function parsePoints(text: string): Array<[number, number]> | null {
  const lines = text.split(/[;\n]/).map((line) => line.trim()).filter(Boolean);
  const points = lines.map((line) => line.split(/[\s,]+/).map(Number));
  return points.every((p) => p.length === 2 && p.every((v) => Number.isFinite(v))) ? (points as Array<[number, number]>) : null;
}
