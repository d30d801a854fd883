// The demo tells one story: every text of the demo study, its samples and the example files names the same team,
// detector and campaign (lib/demo/scenario.ts), never a variant of them.
import { describe, expect, it } from 'vitest';
import { EXAMPLE_FILES } from '@/lib/demo/example-files';
import { DEMO_NAMES, demoSampleSpec } from '@/lib/demo/scenario';
import { DEMO_NOTES, DEMO_STUDY } from '@/lib/demo/study-text';

/** Every demo text a person reads: the study, its notes, the samples and the example files' headers. */
function demoTexts(): string[] {
  const samples = (['quark', 'gluon'] as const).map(demoSampleSpec);
  const exampleHeads = EXAMPLE_FILES.map((file) => {
    const first = file.lines()[Symbol.iterator]().next().value as string;
    return file.name.includes('hepmc3') ? [...file.lines()].slice(0, 4).join('\n') : first;
  });
  return [
    DEMO_STUDY.title,
    DEMO_STUDY.description,
    ...DEMO_NOTES.flatMap((note) => [note.title, note.body]),
    ...samples.flatMap((spec) => [spec.name, spec.description, ...Object.values(spec.scenario)]),
    ...exampleHeads,
  ];
}

describe('the demo scenario', () => {
  it('names the team, the detector and the campaign the same way in every text', () => {
    const texts = demoTexts().join('\n');
    // Each mention of an invented name is one of the scenario's three names.
    for (const match of texts.matchAll(/(Larkspur|Tallis)/g)) {
      const mention = texts.slice(match.index, match.index + 40).split('\n')[0];
      expect(
        Object.values(DEMO_NAMES).some((name) => texts.startsWith(name, match.index)),
        `"${mention}" is not one of ${JSON.stringify(DEMO_NAMES)}`,
      ).toBe(true);
    }
    for (const name of Object.values(DEMO_NAMES)) expect(texts).toContain(name);
  });

  it('puts the campaign in the study title and in every sample name', () => {
    expect(DEMO_STUDY.title).toContain(DEMO_NAMES.campaign);
    for (const parton of ['quark', 'gluon'] as const) expect(demoSampleSpec(parton).name.startsWith(DEMO_NAMES.campaign)).toBe(true);
  });
});
