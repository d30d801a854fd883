// The jet-definition settings in words, for the provenance and the counts of a sample.
import type { CompleteSampleSettings } from '@/models/sample-fields';

export function exclusiveText(ex: CompleteSampleSettings['jet']['exclusive']): string {
  if (!ex) return 'inclusive';
  return 'n' in ex ? `exclusive, exactly ${ex.n} jets` : 'dcut' in ex ? `exclusive, d_cut = ${ex.dcut}` : `exclusive, y_cut = ${ex.ycut}`;
}

export function constituentsText(p: CompleteSampleSettings['particles']): string {
  const rules = [
    p.dropNeutrinos && 'no neutrinos',
    p.pidExclude.length > 0 && `pid not in ${p.pidExclude.join(', ')}`,
    p.pidInclude.length > 0 && `pid in ${p.pidInclude.join(', ')}`,
    p.chargedOnly && 'charged only',
    p.ptMin > 0 && `pt > ${p.ptMin} GeV`,
    p.rapidityMax !== null && `|${p.rapidityKind === 'eta' ? 'η' : 'y'}| < ${p.rapidityMax}`,
  ].filter(Boolean);
  return rules.length ? rules.join(', ') : 'every particle';
}
