// What a plane view computes, shared by Map and Contrast entries (and the Separation entries built on them): which
// splittings, which coordinates, which bins, which jets. Checked with zod wherever it comes in (an entry's saved
// settings, a query string, a page address); every field has a default, so `{}` is the standard primary plane of
// all jets with ranges fitted to the sample. Types only depend on zod, so pages use the same schema.
import { z } from 'zod';
import { HORIZONTAL_VARIABLES, TREE_CHOICES, VERTICAL_VARIABLES } from '@/lib/physics/plane/axes';
import { FILTER_MAX_LENGTH } from './filter-expression';

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);
const optionalBound = (what: string) => finite(what).nullable().default(null);

const axisRange = (name: string) =>
  z
    .strictObject({
      /** null: fitted to where the sample's splittings are. */
      min: optionalBound(`${name}.min`),
      max: optionalBound(`${name}.max`),
      /** Bin size in the coordinate's units (natural-log units for logarithmic coordinates); null: the default. */
      step: finite(`${name}.step`).refine((v) => v > 0, `${name}.step must be above 0`).nullable().default(null),
    })
    .refine((r) => r.min === null || r.max === null || r.max > r.min, { error: `${name}: max must be above min`, path: ['max'] });

export const selectionSchema = z
  .strictObject({
    ptMin: optionalBound('selection.ptMin'),
    ptMax: optionalBound('selection.ptMax'),
    absYMin: optionalBound('selection.absYMin'),
    absYMax: optionalBound('selection.absYMax'),
    /** Keep only the leading N jets of each record (by pt); null keeps all. */
    leading: z.number({ error: 'selection.leading must be a whole number or null' }).int('selection.leading must be a whole number').min(1, 'selection.leading must be at least 1').nullable().default(null),
    /** A filter expression over per-jet columns (filter-expression.ts); empty: none. */
    filter: z.string({ error: 'selection.filter must be text' }).max(FILTER_MAX_LENGTH, `selection.filter must be at most ${FILTER_MAX_LENGTH} characters`).default(''),
  })
  .refine((s) => s.ptMin === null || s.ptMax === null || s.ptMax > s.ptMin, { error: 'selection: ptMax must be above ptMin', path: ['ptMax'] })
  .refine((s) => s.absYMin === null || s.absYMax === null || s.absYMax > s.absYMin, { error: 'selection: absYMax must be above absYMin', path: ['absYMax'] });

export const planeViewSchema = z.strictObject({
  tree: z.enum(TREE_CHOICES, { error: `tree must be one of ${TREE_CHOICES.join(', ')}` }).default('primary'),
  x: z
    .strictObject({
      variable: z.enum(HORIZONTAL_VARIABLES, { error: `x.variable must be one of ${HORIZONTAL_VARIABLES.join(', ')}` }).default('lnInvDelta'),
      log: z.boolean({ error: 'x.log must be true or false' }).default(false),
    })
    .default({ variable: 'lnInvDelta', log: false }),
  y: z
    .strictObject({
      variable: z.enum(VERTICAL_VARIABLES, { error: `y.variable must be one of ${VERTICAL_VARIABLES.join(', ')}` }).default('lnKt'),
      log: z.boolean({ error: 'y.log must be true or false' }).default(false),
    })
    .default({ variable: 'lnKt', log: false }),
  bins: z
    .strictObject({ x: axisRange('bins.x').default({ min: null, max: null, step: null }), y: axisRange('bins.y').default({ min: null, max: null, step: null }) })
    .default({ x: { min: null, max: null, step: null }, y: { min: null, max: null, step: null } }),
  selection: selectionSchema.default({ ptMin: null, ptMax: null, absYMin: null, absYMax: null, leading: null, filter: '' }),
});

export type PlaneView = z.output<typeof planeViewSchema>;
export type PlaneViewInput = z.input<typeof planeViewSchema>;
export type JetSelection = z.output<typeof selectionSchema>;

export function defaultPlaneView(): PlaneView {
  return planeViewSchema.parse({});
}

/** Whether the selection keeps every processed jet (then maps can come from the cached fine histograms). */
export function isDefaultSelection(s: JetSelection): boolean {
  return s.ptMin === null && s.ptMax === null && s.absYMin === null && s.absYMax === null && s.leading === null && s.filter.trim() === '';
}

/** A canonical text of the view, for cache keys: equal views give equal keys. */
export function planeViewKey(view: PlaneView): string {
  const { tree, x, y, bins, selection } = view;
  return JSON.stringify([
    tree,
    x.variable,
    x.log,
    y.variable,
    y.log,
    [bins.x.min, bins.x.max, bins.x.step, bins.y.min, bins.y.max, bins.y.step],
    [selection.ptMin, selection.ptMax, selection.absYMin, selection.absYMax, selection.leading, selection.filter.trim()],
  ]);
}
