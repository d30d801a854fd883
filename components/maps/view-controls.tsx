'use client';

import { type FormEvent, useEffect, useId, useState } from 'react';
import { axisLabel, TREE_LABELS, type Collision } from '@/lib/maps/axis-labels';
import type { DisplaySettings } from '@/lib/maps/entry-settings';
import { compileFilter, FilterError } from '@/lib/maps/filter-expression';
import { type PlaneView, planeViewSchema } from '@/lib/maps/view-settings';
import { type AxisChoice, HORIZONTAL_VARIABLES, type PlaneVariable, SCALABLE_VARIABLES, TREE_CHOICES, VERTICAL_VARIABLES } from '@/lib/physics/plane/axes';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { ChoiceButtons } from './choice-buttons';

const numberClass = `${inlineSelectClass} w-24`;

interface Draft {
  xMin: string;
  xMax: string;
  xStep: string;
  yMin: string;
  yMax: string;
  yStep: string;
  ptMin: string;
  ptMax: string;
  absYMin: string;
  absYMax: string;
  leading: string;
  filter: string;
}

const text = (v: number | null) => (v === null ? '' : String(v));
const number = (v: string) => (v.trim() === '' ? null : Number(v));

function draftOf(view: PlaneView): Draft {
  const { bins, selection: s } = view;
  return {
    xMin: text(bins.x.min),
    xMax: text(bins.x.max),
    xStep: text(bins.x.step),
    yMin: text(bins.y.min),
    yMax: text(bins.y.max),
    yStep: text(bins.y.step),
    ptMin: text(s.ptMin),
    ptMax: text(s.ptMax),
    absYMin: text(s.absYMin),
    absYMax: text(s.absYMax),
    leading: text(s.leading),
    filter: s.filter,
  };
}

function NumberInput({ label, value, onChange, placeholder }: { label: string; value: string; onChange: (v: string) => void; placeholder?: string }) {
  const id = useId();
  return (
    <span className="inline-flex items-center gap-1.5 text-sm text-ink-soft">
      <label htmlFor={id}>{label}</label>
      <input id={id} type="text" inputMode="decimal" value={value} placeholder={placeholder} onChange={(event) => onChange(event.target.value)} className={numberClass} />
    </span>
  );
}

const NO_RANGE = { min: null, max: null, step: null };

/** One coordinate of the plane: which variable, and for Δ, z and kt whether its bins are logarithmic. */
function AxisSelect({
  label,
  variables,
  axis,
  collision,
  onChange,
}: {
  label: string;
  variables: readonly PlaneVariable[];
  axis: AxisChoice;
  collision: Collision;
  onChange: (axis: AxisChoice) => void;
}) {
  return (
    <>
      <label className="flex items-center gap-2 text-ink-soft">
        {label}
        <select aria-label={label} className={inlineSelectClass} value={axis.variable} onChange={(event) => onChange({ ...axis, variable: event.target.value as PlaneVariable })}>
          {variables.map((variable) => (
            <option key={variable} value={variable}>
              {axisLabel({ variable, log: false }, collision)}
            </option>
          ))}
        </select>
      </label>
      {SCALABLE_VARIABLES.includes(axis.variable) && (
        <label className="flex items-center gap-1.5 text-ink-soft">
          <input type="checkbox" checked={axis.log} onChange={(event) => onChange({ ...axis, log: event.target.checked })} />
          log scale
        </label>
      )}
    </>
  );
}

interface ViewControlsProps {
  view: PlaneView;
  /** How the figure is drawn; without it (a Separation's ln-ratio map) there is no colour or overlay control. */
  display?: DisplaySettings;
  onView: (view: PlaneView) => void;
  onDisplay?: (display: DisplaySettings) => void;
  /** A refusal of the filter from the server, shown at the filter field. */
  serverFilterError?: string | null;
  /** The samples' collision type: e+e− planes name θ and kₜ = E sin θ. */
  collision?: Collision;
  /** Overlays and the expectation are for maps of densities; contrasts leave them out. */
  withOverlays?: boolean;
}

/** The settings of a plane view: splittings, coordinates, ranges and bins, jet selection, colour and overlays. */
export function ViewControls({ view, display, onView, onDisplay, serverFilterError, withOverlays = true, collision = 'hadron' }: ViewControlsProps) {
  const [draft, setDraft] = useState<Draft>(() => draftOf(view));
  const [problem, setProblem] = useState<string | null>(null);
  const [filterProblem, setFilterProblem] = useState<string | null>(null);
  const filterId = useId();
  useEffect(() => setDraft(draftOf(view)), [view]);
  const set = (key: keyof Draft) => (value: string) => setDraft((d) => ({ ...d, [key]: value }));

  function apply(event: FormEvent) {
    event.preventDefault();
    try {
      compileFilter(draft.filter);
      setFilterProblem(null);
    } catch (error) {
      if (error instanceof FilterError) {
        setFilterProblem(error.message);
        return;
      }
      throw error;
    }
    const candidate = {
      ...view,
      bins: { x: { min: number(draft.xMin), max: number(draft.xMax), step: number(draft.xStep) }, y: { min: number(draft.yMin), max: number(draft.yMax), step: number(draft.yStep) } },
      selection: { ptMin: number(draft.ptMin), ptMax: number(draft.ptMax), absYMin: number(draft.absYMin), absYMax: number(draft.absYMax), leading: number(draft.leading), filter: draft.filter },
    };
    const parsed = planeViewSchema.safeParse(candidate);
    if (!parsed.success) {
      setProblem(parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`).join('; '));
      return;
    }
    setProblem(null);
    onView(parsed.data);
  }

  const filterError = filterProblem ?? serverFilterError ?? null;
  const overlays = display?.overlays;
  const setOverlay = (change: Partial<DisplaySettings['overlays']>) => display && onDisplay?.({ ...display, overlays: { ...overlays!, ...change } });

  return (
    <div className="space-y-3 text-sm">
      <div className="flex flex-wrap items-center gap-3">
        <label className="flex items-center gap-2 text-ink-soft">
          Splittings
          <select aria-label="Splittings" className={inlineSelectClass} value={view.tree} onChange={(event) => onView({ ...view, tree: event.target.value as PlaneView['tree'] })}>
            {TREE_CHOICES.map((tree) => (
              <option key={tree} value={tree}>
                {TREE_LABELS[tree]}
              </option>
            ))}
          </select>
        </label>
        <AxisSelect label="Horizontal" variables={HORIZONTAL_VARIABLES} axis={view.x} collision={collision} onChange={(x) => onView({ ...view, x: x as PlaneView['x'], bins: { ...view.bins, x: NO_RANGE } })} />
        <AxisSelect label="Vertical" variables={VERTICAL_VARIABLES} axis={view.y} collision={collision} onChange={(y) => onView({ ...view, y: y as PlaneView['y'], bins: { ...view.bins, y: NO_RANGE } })} />
        {display && onDisplay && (
          <ChoiceButtons label="Colour scale" value={display.colour} options={[['linear', 'Linear colour'], ['log', 'Log colour']]} onChange={(colour) => onDisplay({ ...display, colour })} />
        )}
      </div>

      <form onSubmit={apply} aria-label="Ranges, bins and jets" className="space-y-2 rounded-md border border-ink/10 bg-paper px-3 py-2">
        {(['Horizontal', 'Vertical'] as const).map((name) => {
          const [min, max, step] = name === 'Horizontal' ? (['xMin', 'xMax', 'xStep'] as const) : (['yMin', 'yMax', 'yStep'] as const);
          return (
            <div key={name} className="flex flex-wrap items-center gap-x-4 gap-y-2">
              <span className="w-24 font-medium text-ink">{name}</span>
              <NumberInput label={`${name} min`} value={draft[min]} onChange={set(min)} placeholder="fitted" />
              <NumberInput label={`${name} max`} value={draft[max]} onChange={set(max)} placeholder="fitted" />
              <NumberInput label={`${name} bin size`} value={draft[step]} onChange={set(step)} placeholder="default" />
            </div>
          );
        })}
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <span className="w-24 font-medium text-ink">Jets</span>
          <NumberInput label="pₜ min (GeV)" value={draft.ptMin} onChange={set('ptMin')} />
          <NumberInput label="pₜ max" value={draft.ptMax} onChange={set('ptMax')} />
          <NumberInput label="|y| min" value={draft.absYMin} onChange={set('absYMin')} />
          <NumberInput label="|y| max" value={draft.absYMax} onChange={set('absYMax')} />
          <NumberInput label="Leading N" value={draft.leading} onChange={set('leading')} placeholder="all" />
        </div>
        <div className="space-y-1">
          <div className="flex flex-wrap items-center gap-2">
            <label htmlFor={filterId} className="w-24 font-medium text-ink">
              Filter
            </label>
            <input
              id={filterId}
              type="text"
              value={draft.filter}
              onChange={(event) => set('filter')(event.target.value)}
              placeholder="e.g. pt > 400 and m_g < 40"
              aria-invalid={filterError ? true : undefined}
              aria-describedby={`${filterId}-help`}
              className={`${inlineSelectClass} min-w-0 flex-1 font-mono`}
            />
            <Button type="submit" size="sm" variant="primary">
              Apply
            </Button>
          </div>
          <p id={`${filterId}-help`} className={`text-xs ${filterError ? 'text-danger' : 'text-ink-faint'}`} role={filterError ? 'alert' : undefined}>
            {filterError ?? 'Columns: pt, y, phi, m, n, weight, m_g, z_g, R_g, multiplicity; and, or, not, comparisons, arithmetic, abs, log, sqrt, min, max.'}
          </p>
          {problem && (
            <p role="alert" className="text-xs text-danger">
              {problem}
            </p>
          )}
        </div>
      </form>

      {withOverlays && overlays && (
        <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <legend className="sr-only">Overlays</legend>
          <label className="flex items-center gap-1.5 text-ink-soft">
            <input type="checkbox" checked={overlays.radius} onChange={(event) => setOverlay({ radius: event.target.checked })} />
            Jet radius Δ = R
          </label>
          <label className="flex items-center gap-1.5 text-ink-soft">
            <input type="checkbox" checked={overlays.zEdges} onChange={(event) => setOverlay({ zEdges: event.target.checked })} />
            z = ½ edge and z = 0.1, 0.01
          </label>
          <label className="flex items-center gap-1.5 text-ink-soft">
            <input type="checkbox" checked={overlays.ktBoundary} onChange={(event) => setOverlay({ ktBoundary: event.target.checked })} />
            kₜ = 1 GeV
          </label>
          <label className="flex items-center gap-2 text-ink-soft">
            Leading-order expectation
            <select className={inlineSelectClass} value={overlays.expectation} onChange={(event) => setOverlay({ expectation: event.target.value as DisplaySettings['overlays']['expectation'] })}>
              <option value="none">off</option>
              <option value="softCollinear">soft-collinear</option>
              <option value="hardCollinear">with hard-collinear terms</option>
            </select>
          </label>
          <ChoiceButtons label="Initiating parton" value={overlays.parton} options={[['quark', 'quark'], ['gluon', 'gluon']]} onChange={(parton) => setOverlay({ parton })} />
        </fieldset>
      )}
    </div>
  );
}
