import { describe, expect, it } from 'vitest';
import { moveInOrder } from '@/lib/studies/entry-order';

describe('moving an entry in the list', () => {
  const ids = [10, 20, 30, 40];

  it.each([
    [40, 0, [40, 10, 20, 30]],
    [10, 3, [20, 30, 40, 10]],
    [20, 2, [10, 30, 20, 40]],
    [30, 2, [10, 20, 30, 40]],
  ])('moves %i to %i', (id, target, expected) => {
    expect(moveInOrder(ids, id, target)).toEqual(expected);
  });

  it('clamps positions past either end', () => {
    expect(moveInOrder(ids, 20, 99)).toEqual([10, 30, 40, 20]);
    expect(moveInOrder(ids, 30, -5)).toEqual([30, 10, 20, 40]);
  });

  it('keeps every id exactly once and leaves the input alone', () => {
    const input = [...ids];
    const moved = moveInOrder(input, 30, 1);
    expect([...moved].sort()).toEqual([...ids].sort());
    expect(input).toEqual(ids);
  });
});
