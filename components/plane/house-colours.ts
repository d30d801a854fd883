// Splitfield's own colour schemes for planes, defined in CIE L*C*h (D65) so that lightness, the cue every reader
// (colour-vision deficient ones included) can use, changes evenly:
// - "ember" (sequential, densities): lightness rises evenly from 16 to 96 while the hue turns from wine through rust
//   and amber to cream; a deuteranope or protanope still sees an even dark-to-light ramp.
// - "tide" (diverging, contrasts): deep blue below the centre, a near-white neutral at it, deep umber above; blue
//   against orange-brown stays apart for every common colour-vision deficiency, and both arms have the same
//   lightness at the same distance from the centre.

export type Rgb = [number, number, number];
export type Lab = [number, number, number];

const WHITE = [0.95047, 1, 1.08883];

function toLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}
function fromLinear(c: number): number {
  return c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
}

/** sRGB (0..1) to linear-light RGB. */
export function linearRgb(rgb: Rgb): Rgb {
  return rgb.map(toLinear) as Rgb;
}

/** Linear-light RGB to CIE L*a*b* (D65). */
export function labOfLinear([r, g, b]: Rgb): Lab {
  const xyz = [0.4124 * r + 0.3576 * g + 0.1805 * b, 0.2126 * r + 0.7152 * g + 0.0722 * b, 0.0193 * r + 0.1192 * g + 0.9505 * b];
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : (24389 / 27 * t + 16) / 116);
  const [fx, fy, fz] = xyz.map((v, i) => f(v / WHITE[i]));
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

export function labOf(rgb: Rgb): Lab {
  return labOfLinear(linearRgb(rgb));
}

function rgbOfLab([L, a, bb]: Lab): Rgb {
  const fy = (L + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - bb / 200;
  const inv = (t: number) => (t ** 3 > 216 / 24389 ? t ** 3 : (116 * t - 16) / (24389 / 27));
  const [x, y, z] = [inv(fx) * WHITE[0], inv(fy) * WHITE[1], inv(fz) * WHITE[2]];
  const lin = [3.2406 * x - 1.5372 * y - 0.4986 * z, -0.9689 * x + 1.8758 * y + 0.0415 * z, 0.0557 * x - 0.204 * y + 1.057 * z];
  return lin.map((c) => Math.min(1, Math.max(0, fromLinear(c)))) as Rgb;
}

function lch(L: number, C: number, hDegrees: number): Lab {
  const h = (hDegrees * Math.PI) / 180;
  return [L, C * Math.cos(h), C * Math.sin(h)];
}

function hex(rgb: Rgb): string {
  return `#${rgb.map((c) => Math.round(c * 255).toString(16).padStart(2, '0')).join('')}`;
}

/** Ember at t ∈ [0, 1]: L 16 → 96 linearly, hue 350° → 95°, chroma rising to 55 in the middle. */
export function emberLab(t: number): Lab {
  const u = Math.min(1, Math.max(0, t));
  return lch(16 + 80 * u, 30 + 25 * Math.sin(Math.PI * u) - 12 * u, 350 + 105 * u);
}

/** Tide at t ∈ [0, 1], centre at 1/2: L 35 → 97 → 35, blue (hue 258°) below, umber (hue 58°) above. */
export function tideLab(t: number): Lab {
  const u = Math.min(1, Math.max(0, t));
  const d = Math.abs(2 * u - 1);
  return lch(97 - 62 * d, 3 + 30 * d, u < 0.5 ? 258 : 58);
}

export function ember(t: number): string {
  return hex(rgbOfLab(emberLab(t)));
}

export function tide(t: number): string {
  return hex(rgbOfLab(tideLab(t)));
}

/** sRGB (0..1) of a scheme's colour, for checks. */
export function rgbOf(scheme: (t: number) => Lab, t: number): Rgb {
  return rgbOfLab(scheme(t));
}
