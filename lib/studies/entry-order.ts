// A study's entries form one list; these rules keep its positions 0..n-1 without gaps or repeats.

/** The ids in their new order after moving one of them to `target` (clamped to the list). */
export function moveInOrder(orderedIds: readonly number[], movedId: number, target: number): number[] {
  const rest = orderedIds.filter((id) => id !== movedId);
  const index = Math.max(0, Math.min(Math.trunc(target), rest.length));
  return [...rest.slice(0, index), movedId, ...rest.slice(index)];
}
