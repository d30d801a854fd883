// Reader of HepMC3 ASCII event files (the "Asciiv3" format of the HepMC3 library, an open standard):
//   HepMC::Version 3.x / HepMC::Asciiv3-START_EVENT_LISTING / run info (W weight names, T tools, A attributes)
//   E evno nvertices nparticles [@ x y z t]   U GEV|MEV MM|CM   W w1 w2 ...   A ...
//   P id parent pid px py pz e m status        V id status [in,...] [@ x y z t]
//   HepMC::Asciiv3-END_EVENT_LISTING
// Each event becomes one record of its final-state (status 1) particles, px,py,pz,E in GeV. Errors name the line
// and the HepMC particle id, as for splitfield-particles.
//
// The reader cuts the file into event blocks (the E line and the lines up to the next event); a block is parsed
// by parseHepMCEventInto, in this thread or, through the raw-line interface, in the pipeline's worker threads.

import { IngestError } from './errors';
import type { IngestHeader } from './header';
import type { LineSource } from './lines';
import { heavyFlavour } from '../physics/particle-id';
import { particleProblem } from '../physics/fourvector';
import { ParticleScratch, quickParticleProblem, type ParsedRecord } from './particle-scratch';
import { BaseReader } from './reader-base';
import type { ParticleReader, ParticleRecord, RawLineBatch, RawLineSource, ReaderOptions } from './types';

const START = 'HepMC::Asciiv3-START_EVENT_LISTING';
const END = 'HepMC::Asciiv3-END_EVENT_LISTING';
const COMP = ['px', 'py', 'pz', 'e'];
/** Marker line the reader appends to an event block cut by the end of the file (never in a real file). */
const TRUNCATED = 'HepMC::Splitfield-TRUNCATED';

function truncatedMessage(lastLine: number): string {
  return `the file ends without the ${END} line after line ${lastLine}: it is truncated (the last event may be incomplete)`;
}

function tokens(line: string): string[] {
  const t = line.split(' ');
  for (let i = 0; i < t.length; i++) {
    if (t[i] === '') return line.trim().split(/\s+/);
  }
  return t;
}

function hepErr(msg: string, line: number, particle?: number, recordLevel = true, code = 'hepmc', field?: string): IngestError {
  return new IngestError(msg, { line, particle, particleLabel: 'HepMC particle', recordLevel, code, field });
}

function shorten(line: string): string {
  return line.length > 40 ? line.slice(0, 37) + '...' : line;
}

/** Run-information line letters allowed outside events (and ignored inside them, with A, C, F, H). */
function isInfoLine(c: number, line: string): boolean {
  return (c === 65 || c === 84 || c === 78 || c === 67 || c === 70 || c === 72 || c === 87) && line.charCodeAt(1) === 32; // A T N C F H W
}

/**
 * Parses one event block (its lines joined with "\n", the E line first, `line` its line number) into `scratch`:
 * the status-1 particles in GeV, their pids, the first weight. Throws IngestError naming the line and particle.
 */
export function parseHepMCEventInto(block: string, line: number, scratch: ParticleScratch): ParsedRecord {
  const lines = block.split('\n');
  const lastLine = lines[lines.length - 1];
  if (lastLine.startsWith(TRUNCATED)) {
    const last = Number(lastLine.slice(TRUNCATED.length + 1));
    throw hepErr(truncatedMessage(last), last);
  }
  const et = tokens(lines[0]);
  const num = Number(et[1]);
  const declared = Number(et[3]);
  if (et.length < 4 || !Number.isInteger(num) || !Number.isInteger(declared)) {
    throw hepErr('an E line needs the event number, the number of vertices and of particles', line);
  }
  let factor = 1;
  let weight = 1;
  let nP = 0;
  let n = 0;
  let pids = new Int32Array(Math.max(16, declared));
  const tagList: number[] = [];
  for (let k = 1; k < lines.length; k++) {
    const l = lines[k];
    const ln = line + k;
    const c = l.charCodeAt(0);
    if (l.length === 0 || (c <= 32 && l.trim() === '')) continue;
    if (c === 80 /* P */ && l.charCodeAt(1) === 32) {
      nP++;
      const t = tokens(l);
      if (t.length < 10) throw hepErr(`a P line needs 9 fields (id parent pid px py pz e m status), found ${t.length - 1}`, ln);
      const status = +t[9];
      const pid = +t[3];
      if (!Number.isInteger(status) || !Number.isInteger(pid) || t[9] === '' || t[3] === '') {
        throw hepErr(`status and pid must be integers, found status ${t[9]}, pid ${t[3]}`, ln, Number(t[1]), true, 'particle');
      }
      if (status !== 1) {
        // Decayed heavy-flavour hadrons (status 2) are kept as tag particles for flavour tags.
        if (status === 2 && heavyFlavour(pid) !== 0) tagList.push(+t[4] * factor, +t[5] * factor, +t[6] * factor, +t[7] * factor, pid);
        continue; // other particles that are not final-state are not read
      }
      const px = +t[4] * factor, py = +t[5] * factor, pz = +t[6] * factor, E = +t[7] * factor;
      if (!(px - px === 0 && py - py === 0 && pz - pz === 0 && E - E === 0) || t[4] === '' || t[5] === '' || t[6] === '' || t[7] === '') {
        const q = [px, py, pz, E].findIndex((v, k) => !(v - v === 0) || t[4 + k] === '');
        throw hepErr(`${COMP[q]} is not a number: ${t[4 + q]}`, ln, Number(t[1]), true, 'particle', COMP[q]);
      }
      const prob = quickParticleProblem(px, py, pz, E);
      if (prob !== null) throw hepErr(prob, ln, Number(t[1]), true, 'particle');
      const out = scratch.ensure(4 * (n + 1));
      out[4 * n] = px;
      out[4 * n + 1] = py;
      out[4 * n + 2] = pz;
      out[4 * n + 3] = E;
      if (n === pids.length) {
        const bigger = new Int32Array(2 * n);
        bigger.set(pids);
        pids = bigger;
      }
      pids[n++] = pid;
    } else if (c === 86 /* V */ && l.charCodeAt(1) === 32) {
      continue;
    } else if (c === 85 /* U */ && l.charCodeAt(1) === 32) {
      const u = (tokens(l)[1] ?? '').toUpperCase();
      if (u === 'GEV') factor = 1;
      else if (u === 'MEV') factor = 1e-3;
      else throw hepErr(`unknown momentum unit ${tokens(l)[1]} (GEV or MEV expected)`, ln);
    } else if (c === 87 /* W */ && l.charCodeAt(1) === 32) {
      const t = tokens(l);
      const w = Number(t[1]);
      if (t.length < 2 || t[1] === '' || !Number.isFinite(w)) throw hepErr(`the event weight is not a number: ${t[1] ?? 'nothing'}`, ln, undefined, true, 'record', 'weight');
      weight = w;
    } else if (!isInfoLine(c, l)) {
      throw hepErr(`not a HepMC3 ASCII line: ${shorten(l)}`, ln);
    }
  }
  if (nP !== declared) throw hepErr(`event ${num} declares ${declared} particles but has ${nP} P lines`, line);
  if (n === 0) throw hepErr(`event ${num} has no final-state (status 1) particles`, line);
  const rec: ParsedRecord = { line, id: num, weight, n, pid: pids.slice(0, n) };
  if (tagList.length) {
    const nt = tagList.length / 5;
    rec.tags = new Float64Array(4 * nt);
    rec.tagPid = new Int32Array(nt);
    for (let i = 0; i < nt; i++) {
      for (let c = 0; c < 4; c++) rec.tags[4 * i + c] = tagList[5 * i + c];
      rec.tagPid[i] = tagList[5 * i + 4];
      const prob = particleProblem(rec.tags[4 * i], rec.tags[4 * i + 1], rec.tags[4 * i + 2], rec.tags[4 * i + 3]);
      if (prob !== null) throw hepErr(`decayed hadron (status 2, pid ${rec.tagPid[i]}): ${prob}`, line, undefined, true, 'particle');
    }
  }
  return rec;
}

interface EventBlock {
  text: string;
  line: number;
}

export class HepMC3Reader extends BaseReader implements RawLineSource {
  readonly kind = 'hepmc3' as const;
  readonly context = { momentum: 'px,py,pz,E', energyUnit: 'GeV', where: 'line' } as const;
  private readonly scratch = new ParticleScratch();

  get raw(): RawLineSource {
    return this;
  }
  get skipBad(): boolean {
    return !!this.opts.skipBad;
  }

  /** The event blocks of the file in order; a block is yielded once the next event (or the end line) is seen. */
  private async *blocks(): AsyncGenerator<EventBlock> {
    const src = this.src;
    let block: string[] | null = null;
    let blockLine = 0;
    let inListing = true;
    let sawEnd = false;
    for (;;) {
      const line = src.take();
      if (line === undefined) {
        if (!(await src.fill())) break;
        continue;
      }
      const ln = src.lineNo;
      const c = line.charCodeAt(0);
      if (c === 69 /* E */ && line.charCodeAt(1) === 32) {
        if (!inListing) throw hepErr(`an event after ${END} without a new ${START}`, ln, undefined, false);
        if (block) yield { text: block.join('\n'), line: blockLine };
        block = [line];
        blockLine = ln;
      } else if (block) {
        if (c === 72 /* H */ && line.startsWith('HepMC::')) {
          if (!line.startsWith(END)) throw hepErr(`${shorten(line)} inside an event listing (missing ${END}?)`, ln, undefined, false);
          yield { text: block.join('\n'), line: blockLine };
          block = null;
          inListing = false;
          sawEnd = true;
        } else block.push(line); // blank lines too: the block's line numbers stay exact
      } else if (line.startsWith(START)) {
        inListing = true;
        sawEnd = false;
      } else if (line.startsWith('HepMC::')) {
        if (line.startsWith(END)) sawEnd = true;
      } else if ((c === 80 || c === 86) && line.charCodeAt(1) === 32) {
        throw hepErr(`a ${c === 80 ? 'P (particle)' : 'V (vertex)'} line outside an event (no E line before it)`, ln, undefined, false);
      } else if (!(line.length === 0 || (c <= 32 && line.trim() === '')) && !isInfoLine(c, line)) {
        throw hepErr(`not a HepMC3 ASCII line: ${shorten(line)}`, ln, undefined, false);
      }
    }
    if (block) {
      // The file ends inside an event: the block carries a marker line, so that parsing it (here or in a worker)
      // reports the truncation as this event's error, in its place among the records (skipped with skip-bad).
      block.push(`${TRUNCATED} ${src.lineNo}`);
      yield { text: block.join('\n'), line: blockLine };
    } else if (!sawEnd) {
      throw hepErr(truncatedMessage(src.lineNo), src.lineNo, undefined, false);
    }
  }

  async *batches(maxParticles = 65536, maxRecords = 4096): AsyncGenerator<ParticleRecord[]> {
    const scratch = this.scratch;
    for await (const b of this.blocks()) {
      const full = this.add(
        () => {
          const r = parseHepMCEventInto(b.text, b.line, scratch);
          return { line: r.line, id: r.id, weight: r.weight, particles: scratch.buf.slice(0, 4 * r.n), pid: r.pid, tags: r.tags, tagPid: r.tagPid };
        },
        maxParticles,
        maxRecords,
      );
      if (full) yield full;
    }
    const b = this.takeBatch();
    if (b) yield b;
    this.finish();
  }

  async *rawBatches(maxChars = 1 << 20, maxRecords = 2048): AsyncGenerator<RawLineBatch> {
    let texts: string[] = [];
    let nos: number[] = [];
    let chars = 0;
    for await (const b of this.blocks()) {
      texts.push(b.text);
      nos.push(b.line);
      chars += b.text.length;
      if (chars >= maxChars || texts.length >= maxRecords) {
        yield { kind: 'hepmc3', lines: texts, lineNos: Float64Array.from(nos) };
        texts = [];
        nos = [];
        chars = 0;
      }
    }
    if (texts.length) yield { kind: 'hepmc3', lines: texts, lineNos: Float64Array.from(nos) };
  }

  accepted(n: number): void {
    this.count += n;
  }
  rejected(e: IngestError): void {
    this.skip(e);
  }
  finish(): void {
    this.requireRecords('event', 'the file has no events', this.src.lineNo);
  }
}

/** Reads the HepMC3 header (up to the first E line) of a source whose first line has been taken. */
export async function openHepMC3FromLines(src: LineSource, firstLine: string, opts: ReaderOptions = {}): Promise<ParticleReader> {
  let line: string | null = firstLine;
  let version: string | null = null;
  let started = false;
  const weightNames: string[] = [];
  const tools: string[] = [];
  const attributes: Record<string, string> = {};
  while (line !== null) {
    const ln = src.lineNo;
    if (line.startsWith('HepMC::Version')) {
      version = line.slice('HepMC::Version'.length).trim();
      if (/^2\./.test(version)) throw new IngestError(`HepMC version ${version} files are not read; write HepMC3 ASCII (Asciiv3)`, { line: ln, code: 'version' });
    } else if (line.startsWith('HepMC::IO_GenEvent')) {
      throw new IngestError('this is a HepMC2 (IO_GenEvent) file; Splitfield reads HepMC3 ASCII (Asciiv3) files', { line: ln, code: 'version' });
    } else if (line.startsWith(START)) {
      started = true;
    } else if (line.startsWith('HepMC::') && !line.startsWith(END)) {
      throw new IngestError(`unknown HepMC listing: ${line} (HepMC3 ASCII files start with ${START})`, { line: ln, code: 'header' });
    } else if (line.startsWith('E ') || line.startsWith(END)) {
      if (!started) throw new IngestError(`missing the ${START} line before the first event`, { line: ln, code: 'header' });
      src.untake();
      break;
    } else if (line.startsWith('W ')) {
      weightNames.push(...line.slice(2).split('\\|').map((s) => s.trim()));
    } else if (line.startsWith('T ')) {
      tools.push(line.slice(2).replace(/\\\|/g, ' | ').trim());
    } else if (line.startsWith('A ')) {
      const rest = line.slice(2).trim();
      const sp = rest.indexOf(' ');
      if (sp > 0) attributes[rest.slice(0, sp)] = rest.slice(sp + 1);
    } else if (line.trim() !== '' && !line.startsWith('N ')) {
      throw new IngestError(`not a HepMC3 ASCII header line: ${shorten(line)}`, { line: ln, code: 'header' });
    }
    line = await src.readLine();
  }
  if (!started) throw new IngestError(`not a HepMC3 ASCII file: no ${START} line`, { line: src.lineNo || 1, code: 'header' });
  const header: IngestHeader = {
    format: 'hepmc3',
    version: version ?? '3',
    content: 'events',
    momentum: 'px,py,pz,E',
    energyUnit: 'GeV',
    sample: {},
    metadata: { hepmcVersion: version, weightNames, tools, attributes },
    layout: 'ascii',
    gzip: src.gzip,
  };
  return new HepMC3Reader(header, src, opts);
}
