// The engine's entry for one record with everything it may carry: the constituent selection
// (constituent-selection.ts), the flavour ghosts (flavour.ts), then the hadron-collider engine (process.ts) or
// the e+e- one (ee-process.ts). Settings that ask for none of these go straight to processParticles.

import { noneRemoved, selectConstituents, selectsAll } from './constituent-selection';
import { processEeParticles } from './ee-process';
import { withGhosts, type GhostTags } from './flavour';
import { processParticles } from './process';
import type { ProcessSettings, RecordExtras, RecordResult, RemovedParticles } from './types';

let selected = new Float64Array(4 * 1024);

/** Starts the message of an error that lies in the settings asked for, not in the engine (no pid for a pid rule). */
export const SETTINGS_PROBLEM = 'these settings need what this record lacks: ';

function settingsProblem(e: unknown): never {
  throw new Error(SETTINGS_PROBLEM + (e instanceof Error ? e.message : String(e)));
}

/** Processes one record: `p` holds px, py, pz, E interleaved (GeV, validated), `extras` its pids, charges, tags. */
export function processRecord(p: Float64Array, extras: RecordExtras | undefined, s: ProcessSettings): RecordResult {
  const ee = s.collision === 'ee';
  const select = !selectsAll(s.particles);
  if (!ee && !select && !s.flavourTags) return processParticles(p, s);
  let q = p;
  let removed: RemovedParticles | undefined;
  if (select) {
    if (selected.length < p.length) selected = new Float64Array(Math.max(p.length, 2 * selected.length));
    removed = noneRemoved();
    try {
      q = selectConstituents(p, extras ?? {}, s.particles!, selected, removed);
    } catch (e) {
      settingsProblem(e);
    }
  }
  let tags: GhostTags | undefined;
  if (s.flavourTags) {
    if (s.content !== 'events') settingsProblem(new Error('flavour tags need whole events (content "events")'));
    const g = withGhosts(q, extras);
    q = g.particles;
    tags = g.tags;
  }
  const r = ee ? processEeParticles(q, s, tags) : processParticles(q, s, tags);
  if (removed) r.removed = removed;
  return r;
}
