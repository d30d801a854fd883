// Writes a benchmark input file in the splitfield-particles format (JSON Lines, streamed, full double precision)
// from the seeded generators of tests/support/test-events.ts.
//   node bench/out/generate-inputs.cjs --kind jets|events --count N --n PARTICLES --seed S --out FILE
//     [--vary 0.2]   particle counts uniform within ±vary·n (0: exactly n)
//     [--sprays 4]   events: the number of collimated sprays (jets) in each event
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import { parseArgs } from 'node:util';
import { generateEvent, generateJet } from '../tests/support/test-events';
import { Rng } from '../lib/physics/random';

async function main(): Promise<void> {
  const { values: v } = parseArgs({
    options: {
      kind: { type: 'string' },
      count: { type: 'string' },
      n: { type: 'string' },
      seed: { type: 'string', default: '1' },
      out: { type: 'string' },
      vary: { type: 'string', default: '0.2' },
      sprays: { type: 'string', default: '4' },
    },
  });
  const kind = v.kind === 'events' ? 'events' : 'jets';
  const count = Number(v.count);
  const n = Number(v.n);
  const vary = Number(v.vary);
  const sprays = Number(v.sprays);
  if (!v.out || !(count > 0) || !(n > 0) || !(vary >= 0 && vary < 1) || !(sprays >= 1)) {
    throw new Error('usage: --kind jets|events --count N --n PARTICLES --out FILE [--vary 0.2] [--sprays 4]');
  }
  const out = createWriteStream(v.out);
  const header = {
    format: 'splitfield-particles',
    version: 1,
    content: kind,
    momentum: 'px,py,pz,E',
    energyUnit: 'GeV',
    sample: { name: `bench-${kind}-${n}`, description: `benchmark input: ${count} ${kind} of about ${n} particles (seed ${v.seed})` },
  };
  let buf = JSON.stringify(header) + '\n';
  const rng = new Rng(Number(v.seed));
  for (let i = 0; i < count; i++) {
    const ni = Math.max(2, n + rng.int(-Math.round(vary * n), Math.round(vary * n)));
    const p = kind === 'jets' ? generateJet(rng, { nConstituents: ni, massiveFraction: 0.3 }) : generateEvent(rng, { nParticles: ni, nJets: sprays, massiveFraction: 0.3 });
    let s = `{"id":${i},"particles":[`;
    for (let k = 0; k < p.length; k += 4) {
      if (k) s += ',';
      s += '[' + p[k] + ',' + p[k + 1] + ',' + p[k + 2] + ',' + p[k + 3] + ']';
    }
    buf += s + ']}\n';
    if (buf.length > 1 << 20) {
      if (!out.write(buf)) await once(out, 'drain');
      buf = '';
    }
  }
  out.end(buf);
  await once(out, 'finish');
}

main().catch((e) => {
  process.stderr.write(`generate-inputs: ${e?.stack ?? e}\n`);
  process.exit(1);
});
