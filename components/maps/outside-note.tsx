import type { OutsideView } from '@/lib/maps/shapes';
import { formatValue } from '../plane/value-format';

/** "n per jet outside the shown range": what the figure does not show, and where it lies. */
export function OutsideNote({ outside, splittingsPerJet }: { outside: OutsideView; splittingsPerJet: number }) {
  const sides = [
    outside.left > 0 && `${formatValue(outside.left)} left`,
    outside.right > 0 && `${formatValue(outside.right)} right (Δ = 0 among them)`,
    outside.below > 0 && `${formatValue(outside.below)} below`,
    outside.above > 0 && `${formatValue(outside.above)} above`,
    outside.undefined > 0 && `${formatValue(outside.undefined)} beyond the stored grid or without a coordinate`,
  ].filter(Boolean);
  return (
    <p data-testid="outside-note" className="text-xs text-ink-soft">
      <strong className="font-medium text-ink">{formatValue(outside.perJet)} per jet outside the shown range</strong>
      {sides.length > 0 ? ` (${sides.join(', ')})` : ''}, of {formatValue(splittingsPerJet)} splittings per jet in all.
    </p>
  );
}
