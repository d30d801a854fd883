// The HepMC3 ASCII reader: final-state (status 1) particles of each event, units, weights, and bad input
// named by line and HepMC particle id. An outside check reads a file written by the HepMC3 library itself
// (Debian's libhepmc3-dev, when installed).
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { generateEvents } from '@/tests/support/test-events';
import { gz, hepmc3Text, readAll, readError, tempDir } from './helpers';

const t = tempDir('sf-hepmc-');
afterAll(() => t.cleanup());

const events = generateEvents(11, 3, { nParticles: 25, nJets: 2 });

describe('HepMC3 ASCII reader', () => {
  it('reads the status-1 particles of every event, exactly, with ids, weights and lines', async () => {
    const f = t.file('ev.hepmc', hepmc3Text(events, { weights: [1.5, 2, 0.25] }));
    const { records, header } = await readAll(f);
    expect(header).toMatchObject({ format: 'hepmc3', version: '3.01.02', content: 'events', layout: 'ascii' });
    expect((header as { metadata: { weightNames: string[]; tools: string[] } }).metadata).toMatchObject({ weightNames: ['Default'], tools: ['toy | 1.0 | unit test'] });
    expect(records.map((r) => [r.id, r.weight, r.line])).toEqual([
      [0, 1.5, 5],
      [1, 2, 5 + 32],
      [2, 0.25, 5 + 64],
    ]);
    records.forEach((r, i) => expect(Array.from(r.particles)).toEqual(Array.from(events[i])));
    expect(Array.from(records[0].pid!).every((x) => x === 211)).toBe(true);
    const g = await readAll(t.file('ev.hepmc.gz', gz(hepmc3Text(events))));
    g.records.forEach((r, i) => expect(Array.from(r.particles)).toEqual(Array.from(events[i])));
  });

  it('reads an event larger than the particle buffer whole (the buffer grows while the event is read)', async () => {
    // 3 000 final-state particles: more than the reused buffer's first size (1 024 particles), so it grows
    // mid-event and must keep the particles already read.
    const [big] = generateEvents(12, 1, { nParticles: 3000, nJets: 4 });
    const { records } = await readAll(t.file('big.hepmc', hepmc3Text([big])));
    expect(Array.from(records[0].particles)).toEqual(Array.from(big));
  });

  it('converts MeV to GeV', async () => {
    const { records } = await readAll(t.file('mev.hepmc', hepmc3Text(events.slice(0, 1), { unit: 'MEV' })));
    Array.from(records[0].particles).forEach((v, i) => expect(v).toBeCloseTo(events[0][i], 9));
  });

  it('bad input names the line and the HepMC particle', async () => {
    const text = hepmc3Text(events);
    const lines = text.split('\n');
    const pLine = lines.findIndex((l, i) => i > 40 && l.startsWith('P ') && l.endsWith(' 1'));
    const id = lines[pLine].split(' ')[1];
    const withNaN = lines.map((l, i) => (i === pLine ? l.split(' ').map((x, k) => (k === 6 ? 'nan' : x)).join(' ') : l)).join('\n');
    const e = await readError(t.file('nan.hepmc', withNaN));
    expect(e.message).toBe(`line ${pLine + 1}, HepMC particle ${id}: pz is not a number: nan`);
    const bad = lines.map((l, i) => (i === pLine ? l.split(' ').map((x, k) => (k === 7 ? '1.0e-3' : x)).join(' ') : l)).join('\n');
    expect((await readError(t.file('eltp.hepmc', bad))).message).toMatch(new RegExp(`^line ${pLine + 1}, HepMC particle ${id}: energy below momentum`));
    // a beam particle (status 4) along the axis is fine; a final-state one is not
    const beam = lines.map((l, i) => (i === pLine ? l.split(' ').map((x, k) => (k === 4 || k === 5 ? '0' : k === 7 ? x.replace(/^-/, '') : x)).join(' ') : l));
    const pz = beam[pLine].split(' ')[6];
    beam[pLine] = beam[pLine].split(' ').map((x, k) => (k === 7 ? pz.replace(/^-/, '') : x)).join(' ');
    expect((await readError(t.file('beam.hepmc', beam.join('\n')))).message).toMatch(new RegExp(`^line ${pLine + 1}, HepMC particle ${id}: no finite rapidity`));
  });

  it('truncated file, missing particles, empty event, HepMC2, garbage', async () => {
    const lines = hepmc3Text(events).split('\n');
    const cut = lines.slice(0, 50).join('\n') + '\n';
    expect((await readError(t.file('cut.hepmc', cut))).message).toBe(
      'line 50: the file ends without the HepMC::Asciiv3-END_EVENT_LISTING line after line 50: it is truncated (the last event may be incomplete)',
    );
    const midLine = lines.slice(0, 50).join('\n') + '\n' + lines[50].slice(0, 20);
    expect((await readError(t.file('cutline.hepmc', midLine))).message).toMatch(/^line 51: the file ends without the HepMC::Asciiv3-END_EVENT_LISTING line after line 51/);
    const fewer = lines.filter((_, i) => i !== 20).join('\n');
    expect((await readError(t.file('fewer.hepmc', fewer))).message).toBe('line 5: event 0 declares 28 particles but has 27 P lines');
    const noFinal = hepmc3Text([new Float64Array(0)]);
    expect((await readError(t.file('nofinal.hepmc', noFinal))).message).toBe('line 5: event 0 has no final-state (status 1) particles');
    expect((await readError(t.file('v2.hepmc', 'HepMC::Version 2.06.09\nHepMC::IO_GenEvent-START_EVENT_LISTING\nE 1 2\n'))).message).toMatch(/^line 1: HepMC version 2\.06\.09 files are not read/);
    const junk = [...lines.slice(0, 10), 'Q what is this', ...lines.slice(10)].join('\n');
    expect((await readError(t.file('junk.hepmc', junk))).message).toBe('line 11: not a HepMC3 ASCII line: Q what is this');
    const r = await readAll(t.file('skip.hepmc', fewer), { skipBad: true });
    expect([r.records.length, r.skipped]).toEqual([2, 1]);
    const r2 = await readAll(t.file('skip-cut.hepmc', cut), { skipBad: true });
    expect([r2.records.length, r2.skipped]).toEqual([1, 1]);
  });

  it('reads a file written by the HepMC3 library (outside check: HepMC3 from Debian, libhepmc3-dev)', async () => {
    const src = t.file('write.cc', `
#include "HepMC3/GenEvent.h"
#include "HepMC3/GenVertex.h"
#include "HepMC3/GenParticle.h"
#include "HepMC3/WriterAscii.h"
#include "HepMC3/GenRunInfo.h"
#include <cstdio>
using namespace HepMC3;
int main(int argc, char** argv) {
  auto run = std::make_shared<GenRunInfo>();
  run->set_weight_names({"nominal", "varied"});
  WriterAscii w(argv[1], run);
  for (int ev = 0; ev < 2; ++ev) {
    GenEvent e(run, ev == 0 ? Units::GEV : Units::MEV, Units::MM);
    double f = ev == 0 ? 1 : 1000;
    e.set_event_number(100 + ev);
    auto b1 = std::make_shared<GenParticle>(FourVector(0, 0, 6500 * f, 6500 * f), 2212, 4);
    auto b2 = std::make_shared<GenParticle>(FourVector(0, 0, -6500 * f, 6500 * f), 2212, 4);
    auto v = std::make_shared<GenVertex>();
    v->add_particle_in(b1); v->add_particle_in(b2);
    v->add_particle_out(std::make_shared<GenParticle>(FourVector(10.5 * f, 1 * f, 3 * f, 11 * f), 211, 1));
    auto z = std::make_shared<GenParticle>(FourVector(0, 0, 10 * f, 20 * f), 23, 2);
    v->add_particle_out(z);
    e.add_vertex(v);
    auto v2 = std::make_shared<GenVertex>();
    v2->add_particle_in(z);
    v2->add_particle_out(std::make_shared<GenParticle>(FourVector(-3 * f, 4 * f, 5 * f, 7.5 * f), 13, 1));
    v2->add_particle_out(std::make_shared<GenParticle>(FourVector(3 * f, -4 * f, 5 * f, 12.5 * f), -13, 1));
    e.add_vertex(v2);
    e.weights() = {0.5 + ev, 2.0};
    w.write_event(e);
  }
  w.close();
  return 0;
}`);
    const exe = path.join(t.dir, 'write');
    execFileSync('g++', ['-std=c++17', '-O0', src, '-o', exe, '-lHepMC3'], { stdio: 'pipe' });
    const out = path.join(t.dir, 'lib.hepmc');
    execFileSync(exe, [out]);
    const { records, header } = await readAll(out);
    expect((header as { metadata: { weightNames: string[] } }).metadata.weightNames).toEqual(['nominal', 'varied']);
    expect(records.map((r) => [r.id, r.weight])).toEqual([
      [100, 0.5],
      [101, 1.5],
    ]);
    for (const r of records) {
      expect(Array.from(r.pid!)).toEqual([211, 13, -13]);
      const want = [10.5, 1, 3, 11, -3, 4, 5, 7.5, 3, -4, 5, 12.5];
      Array.from(r.particles).forEach((v, i) => expect(v).toBeCloseTo(want[i], 12));
    }
  });
});
