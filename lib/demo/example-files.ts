// The small example input files users download from the upload page (public/examples/), made by the project's own
// generators in the demo scenario: a jets file, and the same dijet events twice, as splitfield-particles JSON
// Lines and as HepMC3, so that both give the same declusterings. `npm run examples` writes them.
import { generateDijetEvent, generateEmissionRecords, type DijetEventSettings } from '@/lib/physics/emission-generator';
import { Rng } from '@/lib/physics/random';
import { particlesFileLines } from '@/lib/ingest/generated-sample-file';
import { hepmc3Lines, particlesHeaderLine, particlesRecordLine, type HepMC3EventOut } from '@/lib/ingest/particle-file-writer';
import { DEMO_NAMES, DEMO_SCENARIO, demoSampleSpec } from './scenario';

export interface ExampleFile {
  /** File name under public/examples/; `.gz` ones are written gzip-compressed. */
  name: string;
  /** What it holds and how to process it, for the README and the upload page. */
  holds: string;
  command: string;
  lines: () => Iterable<string>;
}

const EXAMPLE_JETS = 300;
const EXAMPLE_EVENTS = 200;

const DIJETS: DijetEventSettings = {
  quarkFraction: 0.5,
  ptMin: 150,
  ptMax: 600,
  spectrumPower: 4,
  jet: { R: 0.4, yMax: 2, ktCut: 1, hardCollinear: true },
  underlying: { perUnitArea: 1, meanPt: 0.5, yMax: 3 },
};

/** A charged pion takes this share of the particles, the rest are photons (a toy mix; every particle is final). */
const CHARGED_SHARE = 2 / 3;
const PION_MASS = 0.13957;
/** Momenta are written to 1 keV so the files stay small; energies are rounded up so that E ≥ |p| still holds. */
const ROUND = 1e6;

interface ExampleEvent {
  particles: Float64Array;
  pid: Int32Array;
  charge: Float64Array;
}

/** The generator's massless particles as pions and photons: E recomputed with the pion mass, rounded. */
function asHadrons(rng: Rng, massless: Float64Array): ExampleEvent {
  const n = massless.length / 4;
  const particles = new Float64Array(4 * n);
  const pid = new Int32Array(n);
  const charge = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const u = rng.next();
    const charged = u < CHARGED_SHARE;
    pid[i] = charged ? (u < CHARGED_SHARE / 2 ? 211 : -211) : 22;
    charge[i] = charged ? Math.sign(pid[i]) : 0;
    const m = charged ? PION_MASS : 0;
    let p2 = 0;
    for (let c = 0; c < 3; c++) {
      const x = Math.round(massless[4 * i + c] * ROUND) / ROUND;
      particles[4 * i + c] = x;
      p2 += x * x;
    }
    particles[4 * i + 3] = Math.ceil(Math.sqrt(p2 + m * m) * ROUND) / ROUND;
  }
  return { particles, pid, charge };
}

function* exampleEvents(): Generator<ExampleEvent> {
  const rng = new Rng(5200);
  for (let k = 0; k < EXAMPLE_EVENTS; k++) yield asHadrons(rng, generateDijetEvent(rng, DIJETS));
}

const EVENTS_SAMPLE = {
  name: `${DEMO_NAMES.campaign}: example dijet events`,
  label: 'dijet-example',
  description: `${EXAMPLE_EVENTS} generated dijet events (a half-and-half mix of quark and gluon jets of 150-600 GeV, with soft underlying activity), a small example input.`,
  tags: ['example', 'generated', 'events'],
};

export const EXAMPLE_FILES: ExampleFile[] = [
  {
    name: 'tallis-quark-jets.jsonl',
    holds: `${EXAMPLE_JETS} generated quark-like jets of 500 GeV (R = 0.8, content "jets": each record is one jet's constituents)`,
    command: 'splitfield decluster tallis-quark-jets.jsonl --R 0.8 --out quark-declusterings.jsonl',
    lines: () => particlesFileLines({ ...demoSampleSpec('quark'), name: `${DEMO_NAMES.campaign}: example quark-like jets`, label: 'q-example' }, EXAMPLE_JETS, 4201),
  },
  {
    name: 'tallis-dijet-events.jsonl.gz',
    holds: `${EXAMPLE_EVENTS} generated dijet events with per-particle pid and charge (content "events": jets are found with anti-kt)`,
    command: 'splitfield decluster tallis-dijet-events.jsonl.gz --R 0.4 --ptmin 100 --out dijet-declusterings.jsonl',
    lines: function* () {
      yield particlesHeaderLine('events', { sample: EVENTS_SAMPLE, scenario: DEMO_SCENARIO, generator: { name: 'splitfield dijet generator', seed: 5200, settings: DIJETS } });
      let k = 0;
      for (const event of exampleEvents()) yield particlesRecordLine({ id: `ev${++k}`, weight: 1, ...event });
    },
  },
  {
    name: 'tallis-dijet-events.hepmc3.gz',
    holds: `the same ${EXAMPLE_EVENTS} dijet events as HepMC3 ASCII (final-state particles with status 1)`,
    command: 'splitfield decluster tallis-dijet-events.hepmc3.gz --R 0.4 --ptmin 100 --out dijet-declusterings-hepmc3.jsonl',
    lines: () => {
      const events = (function* (): Generator<HepMC3EventOut> {
        let k = 0;
        for (const event of exampleEvents()) yield { number: ++k, weight: 1, particles: event.particles, pid: event.pid };
      })();
      return hepmc3Lines(events, 'nominal', `splitfield dijet generator (${DEMO_NAMES.campaign} example, fictional)`);
    },
  },
];
