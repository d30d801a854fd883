// Single-variable taggers on the same evaluation jets as the plane score, for comparison: a per-jet observable of
// the jet table used as the score. Its direction (whether larger values are signal-like) is chosen on the training
// jets (the sign of the difference of the two weighted means), so the evaluation half decides nothing.
import { packed } from './emission-score';
import { rankScores } from './ranked-scores';
import { rocOf, type Roc } from './roc';

export interface VariableTagger {
  /** Larger values signal-like (true) or smaller (false), as chosen on the training jets. */
  largerIsSignal: boolean;
  roc: Roc;
}

function weightedMean(values: ArrayLike<number>, weights: ArrayLike<number>, jets: Uint8Array): number {
  let sum = 0;
  let total = 0;
  for (let j = 0; j < jets.length; j++) {
    if (!jets[j] || Number.isNaN(values[j])) continue;
    sum += weights[j] * values[j];
    total += weights[j];
  }
  return total > 0 ? sum / total : Number.NaN;
}

export interface TaggerSide {
  values: ArrayLike<number>;
  weights: ArrayLike<number>;
  train: Uint8Array;
  evaluate: Uint8Array;
}

export function variableTagger(signal: TaggerSide, background: TaggerSide): VariableTagger {
  const largerIsSignal = !(weightedMean(signal.values, signal.weights, signal.train) < weightedMean(background.values, background.weights, background.train));
  const side = (s: TaggerSide) => {
    const v = packed(s.values, s.evaluate);
    // A jet without a value (e.g. failing SoftDrop in tagging mode) fails every threshold.
    for (let i = 0; i < v.length; i++) v[i] = Number.isNaN(v[i]) ? -Infinity : largerIsSignal ? v[i] : -v[i];
    return rankScores(v, packed(s.weights, s.evaluate));
  };
  return { largerIsSignal, roc: rocOf(side(signal), side(background)) };
}
