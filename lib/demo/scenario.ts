// The one fictional scenario of every demo sample, example file and demo study: the Larkspur jet group preparing
// for the Tallis inner tracker upgrade. Every name here is invented; change them here, and only here.
import type { GeneratedSampleSpec } from '@/lib/ingest/generated-sample-file';
import type { Parton } from '@/lib/physics/lo-density';

export const DEMO_SCENARIO = {
  team: 'Larkspur jet group (fictional)',
  detector: 'Tallis inner tracker (fictional)',
  campaign: 'Tallis upgrade study, phase B (fictional)',
} as const;

/** The demo study's quark-like or gluon-like sample: 500 GeV jets, R = 0.8, light soft background. */
export function demoSampleSpec(parton: Parton): GeneratedSampleSpec {
  const kind = parton === 'quark' ? 'quark-like' : 'gluon-like';
  return {
    name: `Tallis upgrade B: ${kind} jets`,
    label: parton === 'quark' ? 'q-demo' : 'g-demo',
    description:
      `${kind} jets of 500 GeV from Splitfield's leading-order emission generator (hard-collinear splitting ` +
      'functions, one-loop running coupling, kt > 1 GeV) with a light uniform soft background, prepared by the ' +
      'Larkspur jet group for the upgrade of the Tallis inner tracker (all fictional).',
    tags: ['demo', 'generated', kind],
    scenario: { ...DEMO_SCENARIO },
    settings: {
      parton,
      pt: 500,
      R: 0.8,
      yMax: 2,
      ktCut: 1,
      hardCollinear: true,
      background: { perUnitArea: 3, meanPt: 0.4 },
    },
  };
}
