// The train/evaluate split (split.ts): by record position, so that the two halves share no jet and jets of one
// event stay in one half.
import { describe, expect, it } from 'vitest';
import { splitJets, trainsOn } from '@/lib/physics/separation/split';
import { variableTagger } from '@/lib/physics/separation/variable-taggers';

describe('train/evaluate split', () => {
  it('puts every selected jet in exactly one half, by its record, and no unselected jet in either', () => {
    const record = Int32Array.from([0, 0, 1, 2, 2, 3, 4, 5, 5, 5]);
    const selected = Uint8Array.from([1, 1, 1, 1, 0, 1, 1, 1, 1, 1]);
    const { train, evaluate, trainCount, evaluateCount } = splitJets(record, selected);
    for (let j = 0; j < record.length; j++) {
      expect(train[j] + evaluate[j]).toBe(selected[j]);
      if (selected[j]) expect(train[j]).toBe(trainsOn(record[j]) ? 1 : 0);
    }
    expect(Array.from(train)).toEqual([1, 1, 0, 1, 0, 0, 1, 0, 0, 0]);
    expect(trainCount + evaluateCount).toBe(9);
    expect(evaluateCount).toBe(5);
  });

  it('single-variable taggers choose their direction on the training half only', () => {
    // Training jets say larger is signal-like; the evaluation jets are the other way round, so the AUC is below ½.
    const side = (train: number[], evaluate: number[]) => ({
      values: [...train, ...evaluate],
      weights: new Array(train.length + evaluate.length).fill(1),
      train: Uint8Array.from([...train.map(() => 1), ...evaluate.map(() => 0)]),
      evaluate: Uint8Array.from([...train.map(() => 0), ...evaluate.map(() => 1)]),
    });
    const tagger = variableTagger(side([5, 6], [1, 2]), side([1, 2], [5, 6]));
    expect(tagger.largerIsSignal).toBe(true);
    expect(tagger.roc.auc).toBe(0);
  });
});
