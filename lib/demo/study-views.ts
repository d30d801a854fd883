// The demo study's Map, Contrast and Separation entries: a Map of each generated sample, a Contrast of the two with a
// box in the soft-collinear region, and a Separation of the quark-like (signal) from the gluon-like jets, so that a
// first start shows the analysis (words in study-text.ts).
import { contrastSettingsSchema, mapSettingsSchema } from '@/lib/maps/entry-settings';
import { separationSettingsSchema } from '@/lib/separations/settings';
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

/** A Separation with the quark-like jets as the signal and the gluon-like jets as the background. */
export function demoSeparationEntry(ids: Record<Parton, number>) {
  return {
    kind: 'separation' as const,
    title: 'Quark-like against gluon-like: a tagger from the plane',
    body: 'Where on the plane the two samples differ, and how well the Poisson emission score tells them apart.',
    settings: separationSettingsSchema.parse({ signalSampleId: ids.quark, backgroundSampleId: ids.gluon }),
  };
}
