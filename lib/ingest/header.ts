// The header of a splitfield-particles file (DESIGN.md "Upload format"), validated with zod, and the
// format-neutral header that every reader hands to the pipeline.

import { z } from 'zod';
import type { EnergyUnit, MomentumConvention } from '../physics/fourvector';
import { IngestError, type IngestWhere } from './errors';

export const PARTICLES_FORMAT = 'splitfield-particles';

export type ColumnarLayout = 'parquet-lists' | 'parquet-flat' | 'arrow-lists' | 'arrow-flat';
export const PARTICLES_VERSION = 1;

/** What every reader reports about its input, whatever the file format. */
export interface IngestHeader {
  /** 'splitfield-particles' or 'hepmc3'. */
  format: string;
  /** Format version (1 for splitfield-particles; the writer's version string for HepMC3). */
  version: number | string;
  content: 'events' | 'jets';
  /** Convention of the file; reader output is always px,py,pz,E in GeV. */
  momentum: MomentumConvention;
  energyUnit: EnergyUnit;
  sample: { name?: string; label?: string; description?: string; tags?: string[] };
  /** Unknown header fields (splitfield-particles) or run information (HepMC3), kept as given. */
  metadata: Record<string, unknown>;
  /**
   * 'jsonl' or 'document' (one JSON document) for splitfield-particles; 'ascii' for HepMC3; 'parquet-lists',
   * 'parquet-flat', 'arrow-lists', 'arrow-flat' for the columnar files (lib/ingest/columnar/).
   */
  layout: 'jsonl' | 'document' | 'ascii' | ColumnarLayout;
  /** True when the input was gzip-compressed. */
  gzip: boolean;
}

const sampleSchema = z.object({
  name: z.string().optional(),
  label: z.string().optional(),
  description: z.string().optional(),
  tags: z.array(z.string()).optional(),
});

const headerSchema = z.looseObject({
  format: z.literal(PARTICLES_FORMAT),
  version: z.literal(PARTICLES_VERSION),
  content: z.enum(['events', 'jets'], { error: 'content must be "events" or "jets"' }),
  momentum: z.enum(['px,py,pz,E', 'pt,y,phi,m'], { error: 'momentum must be "px,py,pz,E" or "pt,y,phi,m"' }).default('px,py,pz,E'),
  energyUnit: z.enum(['GeV', 'MeV', 'TeV'], { error: 'energyUnit must be "GeV", "MeV" or "TeV"' }).default('GeV'),
  sample: sampleSchema.optional(),
});

const KNOWN = new Set(['format', 'version', 'content', 'momentum', 'energyUnit', 'sample', 'records']);

/** Deepest nesting of objects and arrays kept from a header (metadata is stored and shown; printers recurse). */
export const MAX_HEADER_DEPTH = 32;

/** Whether `value` nests objects or arrays deeper than `limit` levels; iterative, so any depth is safe. */
function nestsDeeperThan(value: unknown, limit: number): boolean {
  const stack: Array<[unknown, number]> = [[value, 1]];
  while (stack.length > 0) {
    const [item, depth] = stack.pop()!;
    if (item === null || typeof item !== 'object') continue;
    if (depth > limit) return true;
    for (const child of Object.values(item)) stack.push([child, depth + 1]);
  }
  return false;
}

/**
 * Validates a parsed header object. `line` is its line number (1 normally).
 * Throws IngestError with a message that names the header field.
 */
export function validateParticlesHeader(obj: unknown, line: number, where: IngestWhere = 'line'): Omit<IngestHeader, 'layout' | 'gzip'> {
  const fail = (msg: string, field?: string, code = 'header') => new IngestError(msg, { line, field, where, code });
  if (obj === null || typeof obj !== 'object' || Array.isArray(obj)) {
    throw fail(`the header must be a JSON object {"format":"${PARTICLES_FORMAT}","version":1,...}`);
  }
  const o = obj as Record<string, unknown>;
  // The two checks that tell "not our file" and "a newer file" apart come first, with their own words.
  if (o.format !== PARTICLES_FORMAT) {
    const got = o.format === undefined ? 'no "format" field' : `format is ${JSON.stringify(o.format)}`;
    throw fail(`wrong header: not a ${PARTICLES_FORMAT} file (${got}); line 1 must be {"format":"${PARTICLES_FORMAT}","version":1,...}`, 'format');
  }
  if (o.version !== PARTICLES_VERSION) {
    const got = o.version === undefined ? 'no "version" field' : `version ${JSON.stringify(o.version)}`;
    throw fail(`unknown format version: ${got}; this Splitfield reads ${PARTICLES_FORMAT} version ${PARTICLES_VERSION}`, 'version', 'version');
  }
  for (const key of Object.keys(o)) {
    if (key !== 'records' && nestsDeeperThan(o[key], MAX_HEADER_DEPTH)) {
      throw fail(`wrong header: the field "${key}" nests objects or arrays more than ${MAX_HEADER_DEPTH} levels deep`, key);
    }
  }
  const r = headerSchema.safeParse(o);
  if (!r.success) {
    const msgs = r.error.issues.map((i) => {
      const path = i.path.join('.');
      return path ? `${path}: ${i.message}` : i.message;
    });
    const field = r.error.issues[0]?.path.join('.') || undefined;
    throw fail(`wrong header: ${msgs.join('; ')}`, field);
  }
  const h = r.data;
  const metadata: Record<string, unknown> = {};
  for (const k of Object.keys(o)) if (!KNOWN.has(k)) metadata[k] = o[k];
  return {
    format: PARTICLES_FORMAT,
    version: PARTICLES_VERSION,
    content: h.content,
    momentum: h.momentum,
    energyUnit: h.energyUnit,
    sample: h.sample ?? {},
    metadata,
  };
}
