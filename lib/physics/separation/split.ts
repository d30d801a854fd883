// The train/evaluate split of a Separation: the density maps (and so the ln-ratio table) are made from one half of
// each sample's jets, the per-jet scores and every figure of merit from the other, so that no figure is biased by
// jets that also made the table. The rule is deterministic and by record, so jets of one event stay together:
// a jet whose record is at an even position in its file (0, 2, 4, …) trains, one at an odd position evaluates.

export const SPLIT_RULE =
  'Jets of records at even positions in their file (the 1st, 3rd, 5th … record) make the density maps; jets of records at odd positions are scored and give the ROC, AUC and rejections.';

export interface SplitMasks {
  /** Per stored jet: 1 when selected and in the training half. */
  train: Uint8Array;
  /** Per stored jet: 1 when selected and in the evaluation half. */
  evaluate: Uint8Array;
  trainCount: number;
  evaluateCount: number;
}

/** Whether a jet of the record at this position (0-based) is in the training half. */
export function trainsOn(recordIndex: number): boolean {
  return (recordIndex & 1) === 0;
}

/** Splits the selected jets (1 in `selected`) by their record's position (`record`, per jet). */
export function splitJets(record: ArrayLike<number>, selected: Uint8Array): SplitMasks {
  const n = selected.length;
  const train = new Uint8Array(n);
  const evaluate = new Uint8Array(n);
  let trainCount = 0;
  for (let j = 0; j < n; j++) {
    if (!selected[j]) continue;
    if ((record[j] & 1) === 0) {
      train[j] = 1;
      trainCount++;
    } else evaluate[j] = 1;
  }
  let selectedCount = 0;
  for (let j = 0; j < n; j++) selectedCount += selected[j];
  return { train, evaluate, trainCount, evaluateCount: selectedCount - trainCount };
}
