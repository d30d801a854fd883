'use client';

import { useEffect, useState } from 'react';
import type { Box } from '@/lib/maps/entry-settings';
import { labelledParton } from '@/lib/maps/parton-label';
import { densityGrid } from '@/lib/maps/plane-grid';
import type { PlaneData, SampleRef } from '@/lib/maps/shapes';
import { boxRatio } from '@/lib/physics/plane/compare';
import { C_A, C_F } from '@/lib/physics/running-coupling';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { formatValue, formatWithError } from '../plane/value-format';

interface BoxResultProps {
  box: Box | null;
  onBox: (box: Box | null) => void;
  a: { sample: SampleRef; plane: PlaneData };
  b: { sample: SampleRef; plane: PlaneData };
  xLabel: string;
  yLabel: string;
}

/** The box drawn on a contrast (or typed in): the mean ratio B/A inside it, beside C_A/C_F when that applies. */
export function BoxResult({ box, onBox, a, b, xLabel, yLabel }: BoxResultProps) {
  const [corners, setCorners] = useState(['', '', '', '']);
  useEffect(() => setCorners(box ? [box.x1, box.x2, box.y1, box.y2].map((v) => String(Number(v.toPrecision(4)))) : ['', '', '', '']), [box]);
  const typed = () => {
    const [x1, x2, y1, y2] = corners.map(Number);
    if ([x1, x2, y1, y2].every(Number.isFinite) && x1 !== x2 && y1 !== y2) onBox({ x1: Math.min(x1, x2), x2: Math.max(x1, x2), y1: Math.min(y1, y2), y2: Math.max(y1, y2) });
  };
  const result = box ? boxRatio(densityGrid(a.plane), densityGrid(b.plane), box) : null;
  const partons = [labelledParton(a.sample), labelledParton(b.sample)];
  const expectation = partons[0] === 'quark' && partons[1] === 'gluon' ? C_A / C_F : partons[0] === 'gluon' && partons[1] === 'quark' ? C_F / C_A : null;
  const names = ['x from', 'x to', 'y from', 'y to'];
  return (
    <section aria-label="Box" className="space-y-2 rounded-md border border-ink/10 p-3 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="font-semibold">Box</h3>
        <span className="text-xs text-ink-soft">Drag on the contrast, or type its corners:</span>
        {corners.map((value, k) => (
          <input
            key={names[k]}
            aria-label={`Box ${names[k]}`}
            className={`${inlineSelectClass} w-20`}
            value={value}
            placeholder={k < 2 ? xLabel : yLabel}
            onChange={(event) => setCorners(corners.map((c, i) => (i === k ? event.target.value : c)))}
            onKeyDown={(event) => event.key === 'Enter' && typed()}
          />
        ))}
        <Button size="sm" onClick={typed}>
          Set box
        </Button>
        {box && (
          <Button size="sm" variant="ghost" onClick={() => onBox(null)}>
            Clear
          </Button>
        )}
      </div>
      {result && box && (
        <div data-testid="box-result" className="space-y-1">
          <p>
            In {xLabel} {formatValue(box.x1)} to {formatValue(box.x2)}, {yLabel} {formatValue(box.y1)} to {formatValue(box.y2)} ({result.a.bins} bins):{' '}
            <strong>
              {b.sample.name} / {a.sample.name} = {formatWithError(result.ratio, result.error)}
            </strong>{' '}
            ({formatWithError(result.b.value, Math.sqrt(result.b.variance))} and {formatWithError(result.a.value, Math.sqrt(result.a.variance))} splittings per jet).
          </p>
          {expectation !== null && (
            <p className="text-ink-soft">
              Soft-collinear expectation:{' '}
              {partons[1] === 'gluon' ? (
                <>
                  C<sub>A</sub>/C<sub>F</sub> = 9/4
                </>
              ) : (
                <>
                  C<sub>F</sub>/C<sub>A</sub> = 4/9
                </>
              )}{' '}
              = {formatValue(expectation)} (SU(3) colour factors C<sub>A</sub> = 3, C<sub>F</sub> = 4/3; leading-order emission density 2αₛCᵢ/π from the
              Altarelli–Parisi splitting functions, Nucl. Phys. B126 (1977) 298). C/A clustering lowers the declustered ratio where emissions are dense.
            </p>
          )}
        </div>
      )}
    </section>
  );
}
