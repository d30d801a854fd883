// Writers of the two input formats Splitfield reads, for files the project makes itself (demo samples, the
// example files users download): splitfield-particles JSON Lines (DESIGN.md) and HepMC3 ASCII (the open
// standard's "Asciiv3" event listing: E, U, W, P and V lines). Each function returns text lines without newlines.

/** One record: particles are (px, py, pz, E) in GeV, four doubles a particle; pid and charge optional. */
export interface ParticlesRecordOut {
  id: string | number;
  weight: number;
  particles: Float64Array;
  pid?: Int32Array;
  charge?: Float64Array;
}

/** The header line of a splitfield-particles file; extra fields are kept by readers as metadata. */
export function particlesHeaderLine(content: 'events' | 'jets', extra: Record<string, unknown>): string {
  return JSON.stringify({ format: 'splitfield-particles', version: 1, content, momentum: 'px,py,pz,E', energyUnit: 'GeV', ...extra });
}

export function particlesRecordLine(record: ParticlesRecordOut): string {
  const particles: number[][] = [];
  for (let at = 0; at < record.particles.length; at += 4) particles.push(Array.from(record.particles.subarray(at, at + 4)));
  return JSON.stringify({
    id: record.id,
    weight: record.weight,
    particles,
    ...(record.pid ? { pid: Array.from(record.pid) } : {}),
    ...(record.charge ? { charge: Array.from(record.charge) } : {}),
  });
}

/** One event for HepMC3: its final-state particles (status 1) with their particle codes. */
export interface HepMC3EventOut {
  number: number;
  weight: number;
  particles: Float64Array;
  pid: Int32Array;
}

/** Beam energy written for the two incoming protons of every event (GeV); readers use only status-1 particles. */
const BEAM_ENERGY = 6500;
const PROTON_MASS = 0.938272;

/**
 * A HepMC3 ASCII listing: every event has two beam protons (status 4) joined at one vertex, out of which come its
 * final-state particles (status 1). Momenta in GeV, lengths in mm; `weightName` names the single event weight.
 */
export function* hepmc3Lines(events: Iterable<HepMC3EventOut>, weightName: string, tool: string): Generator<string> {
  yield 'HepMC::Version 3.01.02';
  yield 'HepMC::Asciiv3-START_EVENT_LISTING';
  yield `W ${weightName}`;
  yield `T ${tool.replace(/\|/g, '/')}\\|1\\|`;
  const beamPz = Math.sqrt(BEAM_ENERGY * BEAM_ENERGY - PROTON_MASS * PROTON_MASS);
  for (const event of events) {
    const n = event.particles.length / 4;
    yield `E ${event.number} 1 ${n + 2}`;
    yield 'U GEV MM';
    yield `W ${event.weight}`;
    yield `P 1 0 2212 0 0 ${beamPz} ${BEAM_ENERGY} ${PROTON_MASS} 4`;
    yield `P 2 0 2212 0 0 ${-beamPz} ${BEAM_ENERGY} ${PROTON_MASS} 4`;
    yield 'V -1 0 [1,2]';
    for (let i = 0; i < n; i++) {
      const [px, py, pz, E] = event.particles.subarray(4 * i, 4 * i + 4);
      const m2 = E * E - px * px - py * py - pz * pz;
      const m = m2 > 0 ? Math.sqrt(m2) : 0;
      yield `P ${i + 3} -1 ${event.pid[i]} ${px} ${py} ${pz} ${E} ${m} 1`;
    }
  }
  yield 'HepMC::Asciiv3-END_EVENT_LISTING';
}
