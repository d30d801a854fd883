// Counting kept jets by flavour tag for a run's counts (5 b, 4 c, 0 light; jets without a tag are not counted).

import { FLAVOUR_B, FLAVOUR_C } from '../../physics/particle-id';
import type { JetResult } from '../../physics/types';
import type { PipelineCounts } from './sink';

export function addFlavours(counts: Pick<PipelineCounts, 'flavours'>, jets: JetResult[]): void {
  for (const j of jets) {
    if (j.flavour === undefined || j.flavour < 0) continue;
    const f = (counts.flavours ??= { b: 0, c: 0, light: 0 });
    if (j.flavour === FLAVOUR_B) f.b++;
    else if (j.flavour === FLAVOUR_C) f.c++;
    else f.light++;
  }
}
