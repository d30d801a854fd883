// The house colour schemes: perceptually even (CIE L*a*b* steps, CIE 1976 ΔE) and readable with colour-vision
// deficiency, checked by simulating protanopia, deuteranopia and tritanopia with the matrices of Machado, Oliveira
// and Fernandes, "A physiologically-based model for simulation of color vision deficiency", IEEE TVCG 15 (2009)
// 1291 (severity 1.0, applied to linear RGB).
import { describe, expect, it } from 'vitest';
import { emberLab, labOf, labOfLinear, linearRgb, rgbOf, tideLab, type Lab, type Rgb } from '@/components/plane/house-colours';

const MACHADO: Record<string, number[][]> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

const STEPS = 64;
const deltaE = (p: Lab, q: Lab) => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
const samples = (scheme: (t: number) => Lab) => Array.from({ length: STEPS + 1 }, (_, k) => rgbOf(scheme, k / STEPS));

function simulated(rgb: Rgb, matrix: number[][]): Lab {
  const lin = linearRgb(rgb);
  const out = matrix.map((row) => Math.min(1, Math.max(0, row[0] * lin[0] + row[1] * lin[1] + row[2] * lin[2]))) as Rgb;
  return labOfLinear(out);
}

describe('ember (sequential)', () => {
  const colours = samples(emberLab);

  it('is drawn as defined (inside the sRGB gamut)', () => {
    colours.forEach((rgb, k) => expect(deltaE(labOf(rgb), emberLab(k / STEPS))).toBeLessThan(1));
  });

  it('rises in lightness at every step, and its steps differ by at most a factor 1.6 in ΔE', () => {
    const labs = colours.map(labOf);
    const steps = labs.slice(1).map((lab, k) => deltaE(lab, labs[k]));
    labs.slice(1).forEach((lab, k) => expect(lab[0]).toBeGreaterThan(labs[k][0]));
    expect(Math.max(...steps) / Math.min(...steps)).toBeLessThan(1.6);
  });

  it.each(Object.keys(MACHADO))('keeps its order of lightness for %s', (kind) => {
    const labs = colours.map((rgb) => simulated(rgb, MACHADO[kind]));
    labs.slice(1).forEach((lab, k) => expect(lab[0]).toBeGreaterThan(labs[k][0]));
    expect(labs[STEPS][0] - labs[0][0]).toBeGreaterThan(70);
  });
});

describe('tide (diverging)', () => {
  const colours = samples(tideLab);

  it('is lightest at the centre and equally light at equal distances from it', () => {
    const labs = colours.map(labOf);
    for (let k = 0; k < STEPS / 2; k++) {
      expect(labs[k + 1][0]).toBeGreaterThan(labs[k][0]);
      expect(Math.abs(labs[k][0] - labs[STEPS - k][0])).toBeLessThan(2.5);
    }
    expect(labs[STEPS / 2][0]).toBeGreaterThan(95);
  });

  it.each(Object.keys(MACHADO))('keeps its two arms apart for %s', (kind) => {
    // the ends, seen through the deficiency, stay far apart (ΔE > 30) and far from the centre
    const ends = [simulated(colours[0], MACHADO[kind]), simulated(colours[STEPS], MACHADO[kind])];
    const centre = simulated(colours[STEPS / 2], MACHADO[kind]);
    expect(deltaE(ends[0], ends[1])).toBeGreaterThan(30);
    for (const end of ends) expect(deltaE(end, centre)).toBeGreaterThan(50);
  });
});
