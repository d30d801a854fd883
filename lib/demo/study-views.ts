// The demo study's Map and Contrast entries: a Map of each generated sample and a Contrast of the two with a box in
// the soft-collinear region, so that a first start shows the analysis (words in study-text.ts).
import { contrastSettingsSchema, mapSettingsSchema } from '@/lib/maps/entry-settings';
import type { Parton } from '@/lib/physics/lo-density';

/** The box of the demo contrast: ln(1/Δ) from 1.2 to 3.2, ln(kt/GeV) from 0.4 to 2 (z ≤ 0.07 at 500 GeV there). */
export const DEMO_BOX = { x1: 1.2, x2: 3.2, y1: 0.4, y2: 2 };

export function demoViewEntries(ids: Record<Parton, number>) {
  const map = (parton: Parton, title: string) => ({
    kind: 'map' as const,
    title,
    body: '',
    settings: mapSettingsSchema.parse({ sampleId: ids[parton], display: { overlays: { expectation: 'softCollinear', parton } } }),
  });
  return [
    map('quark', 'Quark-like jets: primary plane'),
    map('gluon', 'Gluon-like jets: primary plane'),
    {
      kind: 'contrast' as const,
      title: 'Gluon-like over quark-like',
      body: 'Drawn box: the soft-collinear region where the leading-order ratio is $C_A/C_F = 9/4$.',
      settings: contrastSettingsSchema.parse({ sampleIds: [ids.quark, ids.gluon], mode: 'ratio', minEntries: 20, box: DEMO_BOX, display: { colour: 'log', projection: { onto: 'y', from: 1.2, to: 3.2 } } }),
    },
  ];
}
