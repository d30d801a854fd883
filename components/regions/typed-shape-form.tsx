'use client';

// Corner coordinates typed in instead of drawn: a rectangle's two ranges or a polygon's corners, checked with the
// same rules as the server (regionGeometrySchema) before they become the shape to save.
import { useState } from 'react';
import type { RegionAxes, RegionShape } from '@/lib/physics/plane/region';
import { regionGeometrySchema } from '@/lib/regions/geometry-schema';
import { Button } from '../button';
import { controlClass, inlineSelectClass } from '../fields';
import { Notice } from '../notice';
import { ChoiceButtons } from '../maps/choice-buttons';
import { parsePoints } from './shape-text';

interface TypedShapeFormProps {
  axes: RegionAxes;
  xLabel: string;
  yLabel: string;
  onShape: (shape: RegionShape) => void;
}

export function TypedShapeForm({ axes, xLabel, yLabel, onShape }: TypedShapeFormProps) {
  const [kind, setKind] = useState<'rectangle' | 'polygon'>('rectangle');
  const [corners, setCorners] = useState(['', '', '', '']);
  const [points, setPoints] = useState('');
  const [error, setError] = useState<string | null>(null);
  const names = [`${xLabel} from`, `${xLabel} to`, `${yLabel} from`, `${yLabel} to`];

  function use() {
    let shape: unknown;
    if (kind === 'rectangle') {
      const [x1, x2, y1, y2] = corners.map((c) => (c.trim() === '' ? Number.NaN : Number(c)));
      shape = { type: 'rectangle', x1, x2, y1, y2 };
    } else {
      const parsed = parsePoints(points);
      if (!parsed) return setError('Write one corner a line as two numbers: x, y.');
      shape = { type: 'polygon', points: parsed };
    }
    const checked = regionGeometrySchema.safeParse({ axes, shape });
    if (!checked.success) return setError(checked.error.issues.map((issue) => issue.message).join('; '));
    setError(null);
    onShape(checked.data.shape);
  }

  return (
    <form
      className="space-y-2"
      aria-label="Type the region's corners"
      onSubmit={(event) => {
        event.preventDefault();
        use();
      }}
    >
      <ChoiceButtons label="Shape" value={kind} options={[['rectangle', 'Rectangle'], ['polygon', 'Polygon']]} onChange={setKind} />
      {kind === 'rectangle' ? (
        <div className="flex flex-wrap gap-2">
          {corners.map((value, k) => (
            <label key={names[k]} className="flex flex-col text-xs text-ink-soft">
              {names[k]}
              <input className={`${inlineSelectClass} w-28`} inputMode="decimal" value={value} onChange={(event) => setCorners(corners.map((c, i) => (i === k ? event.target.value : c)))} />
            </label>
          ))}
        </div>
      ) : (
        <label className="block text-xs text-ink-soft">
          Corners, one a line: {xLabel}, {yLabel}
          <textarea className={`${controlClass} font-mono`} rows={4} value={points} placeholder={'1.0, 0.5\n3.0, 0.5\n2.0, 2.0'} onChange={(event) => setPoints(event.target.value)} />
        </label>
      )}
      {error && <Notice tone="error">{error}</Notice>}
      <Button size="sm" type="submit">
        Use these corners
      </Button>
    </form>
  );
}
