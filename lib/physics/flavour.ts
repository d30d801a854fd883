// Flavour tags by ghost association (PHYSICS.md "Flavour tags"; "The catchment area of jets", JHEP 04 (2008) 005,
// arXiv:0802.1188): each heavy-flavour hadron of the record (a b or c quark among the quark digits of its code in
// the "Monte Carlo particle numbering scheme") is scaled to a negligible four-momentum (GHOST_SCALE) and clustered
// together with the event; a jet whose constituents hold a ghost is tagged by it, b outranking c; other jets are
// light. Ghosts are numbered after the real particles, so a constituent index tells them apart.

import { FLAVOUR_B, FLAVOUR_C, FLAVOUR_LIGHT, heavyFlavour } from './particle-id';
import type { ClusterWorkspace } from './clustering';
import type { RecordExtras } from './types';

/** Factor that turns a hadron's four-momentum into its ghost (the catchment-area paper's "tiny factor"). */
export const GHOST_SCALE = 1e-18;

/** The ghosts of a record: particles numbered from `from` on, with their flavours (5 b, 4 c). */
export interface GhostTags {
  from: number;
  flavour: Int8Array;
}

let buf = new Float64Array(0);

/**
 * The record's particles followed by the ghosts of its heavy-flavour tag hadrons (tag particles of other codes
 * are ignored), in a buffer reused from call to call, and where the ghosts start.
 */
export function withGhosts(p: Float64Array, extras: RecordExtras | undefined): { particles: Float64Array; tags: GhostTags } {
  const n = p.length >> 2;
  const tags = extras?.tags;
  const tagPid = extras?.tagPid;
  const nTags = tags && tagPid ? tagPid.length : 0;
  const flavours: number[] = [];
  if (buf.length < p.length + 4 * nTags) buf = new Float64Array(Math.max(p.length + 4 * nTags, 2 * buf.length));
  buf.set(p, 0);
  let at = p.length;
  for (let t = 0; t < nTags; t++) {
    const f = heavyFlavour(tagPid![t]);
    if (f === FLAVOUR_LIGHT) continue;
    for (let c = 0; c < 4; c++) buf[at + c] = tags![4 * t + c] * GHOST_SCALE;
    at += 4;
    flavours.push(f);
  }
  return { particles: buf.subarray(0, at), tags: { from: n, flavour: Int8Array.from(flavours) } };
}

/** True when node k has at least one real (non-ghost) constituent (its list is bounded by its count). */
export function hasRealConstituent(ws: ClusterWorkspace, k: number, tags: GhostTags): boolean {
  for (let left = ws.count[k], c = ws.first[k]; left > 0; left--, c = ws.next[c]) if (c < tags.from) return true;
  return false;
}

/** The flavour of node k: the highest (b = 5 over c = 4) of the ghosts among its constituents, else light (0). */
export function jetFlavour(ws: ClusterWorkspace, k: number, tags: GhostTags): number {
  let f = FLAVOUR_LIGHT;
  for (let left = ws.count[k], c = ws.first[k]; left > 0; left--, c = ws.next[c]) {
    if (c >= tags.from) {
      const g = tags.flavour[c - tags.from];
      if (g > f) f = g;
    }
  }
  return f;
}

/** The tag's name in files and the API: "b", "c", "light"; null for no tag. */
export function flavourName(f: number | undefined): 'b' | 'c' | 'light' | null {
  if (f === undefined || f < 0) return null;
  return f === FLAVOUR_B ? 'b' : f === FLAVOUR_C ? 'c' : 'light';
}
