// The one fictional scenario of every demo sample, example file and demo study: the Larkspur jet group preparing
// for the Tallis inner tracker upgrade. Every name here is invented; change them here, and only here.
import type { GeneratedSampleSpec } from '@/lib/ingest/generated-sample-file';
import type { Parton } from '@/lib/physics/lo-density';

/** The names as the demo's texts use them: one team, one detector, one campaign, everywhere. */
export const DEMO_NAMES = {
  team: 'Larkspur jet group',
  detector: 'Tallis inner tracker',
  campaign: 'Tallis upgrade, phase B',
} as const;

/** The same names as files carry them in their header metadata, marked as invented. */
export const DEMO_SCENARIO = {
  team: `${DEMO_NAMES.team} (fictional)`,
  detector: `${DEMO_NAMES.detector} (fictional)`,
  campaign: `${DEMO_NAMES.campaign} (fictional)`,
} as const;

/** The demo study's quark-like or gluon-like sample: 500 GeV jets, R = 0.8, light soft background. */
export function demoSampleSpec(parton: Parton): GeneratedSampleSpec {
  const kind = parton === 'quark' ? 'quark-like' : 'gluon-like';
  return {
    name: `${DEMO_NAMES.campaign}: ${kind} jets`,
    label: parton === 'quark' ? 'q-demo' : 'g-demo',
    description:
      `${kind} jets of 500 GeV from Splitfield's leading-order emission generator (hard-collinear splitting ` +
      `functions, one-loop running coupling, kt > 1 GeV) with a light uniform soft background, prepared by the ` +
      `${DEMO_NAMES.team} for the ${DEMO_NAMES.campaign} of the ${DEMO_NAMES.detector} (all fictional).`,
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
