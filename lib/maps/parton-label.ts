// Whether a sample is labelled quark-like or gluon-like (by its tags, label or name), for the soft-collinear
// expectation C_A/C_F = 9/4 that a contrast of the two shows beside its measured ratio.
import type { Parton } from '@/lib/physics/lo-density';

export function labelledParton(sample: { name: string; label: string; tags: string[] }): Parton | null {
  const words = [...sample.tags, sample.label, sample.name].join(' ').toLowerCase();
  const quark = /quark[- ]?(like|jets?|enriched)/.test(words);
  const gluon = /gluon[- ]?(like|jets?|enriched)/.test(words);
  if (quark === gluon) return null;
  return quark ? 'quark' : 'gluon';
}
