// The colour scale of one or more plane figures: the house schemes (house-colours.ts), linear or logarithmic, and
// a domain shared by every map drawn side by side, so that one colour means one value on all of them.
import { ember, tide } from './house-colours';

export type ColourType = 'linear' | 'log';

export interface ColourScale {
  scheme: 'ember' | 'tide';
  type: ColourType;
  domain: [number, number];
  /** Centre of a diverging scale (1 for ratios, 0 for differences and pulls). */
  pivot?: number;
  label: string;
}

/** The domain of a sequential scale over every value of every map (log: positive values only). */
export function sequentialDomain(valueSets: Array<ArrayLike<number | null>>, type: ColourType): [number, number] {
  let low = Infinity;
  let high = -Infinity;
  for (const values of valueSets) {
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (v === null || !Number.isFinite(v) || v <= 0) continue;
      if (v < low) low = v;
      if (v > high) high = v;
    }
  }
  if (!(high > 0)) return type === 'log' ? [0.1, 1] : [0, 1];
  if (type === 'linear') return [0, high];
  return [Math.max(low, high * 1e-4), high];
}

/** A diverging domain symmetric about the pivot (in ratio for log scales) that holds every defined value. */
export function divergingDomain(values: ArrayLike<number | null>, pivot: number, type: ColourType): [number, number] {
  let reach = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null || !Number.isFinite(v)) continue;
    if (type === 'log') {
      if (v > 0) reach = Math.max(reach, Math.abs(Math.log(v / pivot)));
    } else {
      reach = Math.max(reach, Math.abs(v - pivot));
    }
  }
  if (!(reach > 0)) reach = type === 'log' ? Math.log(2) : 1;
  return type === 'log' ? [pivot * Math.exp(-reach), pivot * Math.exp(reach)] : [pivot - reach, pivot + reach];
}

/** Observable Plot colour-scale options for the scale. */
export function plotColour(scale: ColourScale, legend: boolean) {
  const interpolate = scale.scheme === 'ember' ? ember : tide;
  if (scale.scheme === 'ember') {
    return { type: scale.type, domain: scale.domain, interpolate, legend, label: scale.label, clamp: true } as const;
  }
  return {
    type: scale.type === 'log' ? ('diverging-log' as const) : ('diverging' as const),
    pivot: scale.pivot ?? (scale.type === 'log' ? 1 : 0),
    domain: scale.domain,
    interpolate,
    legend,
    label: scale.label,
    clamp: true,
  };
}
