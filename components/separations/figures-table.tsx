import type { WorkingPoint } from '@/lib/physics/separation/roc';
import type { RocView } from '@/lib/separations/shapes';
import { formatValue, formatWithError } from '../plane/value-format';
import type { RocSeries } from './roc-plot';

function rejection(w: WorkingPoint): string {
  if (w.rejection === null) return `> ${formatValue(w.rejectionLowerLimit)}`;
  return formatWithError(w.rejection, w.rejectionError);
}

/** AUC and background rejection at 30, 50 and 70 % signal efficiency of each tagger, best AUC first after the score. */
export function FiguresTable({ series }: { series: RocSeries[] }) {
  const points = (roc: RocView) => roc.workingPoints;
  return (
    <table className="w-full text-sm" data-testid="separation-figures">
      <caption className="pb-1 text-left text-xs text-ink-faint">
        Evaluation jets only. AUC error: Hanley and McNeil (1982). Rejection errors: binomial errors of ε_B and of ε_S through the curve’s slope.
      </caption>
      <thead>
        <tr className="border-b border-ink/10 text-left text-xs uppercase tracking-wide text-ink-faint">
          <th className="py-1 pr-3 font-medium">tagger</th>
          <th className="py-1 pr-3 font-medium">AUC</th>
          <th className="py-1 pr-3 font-medium">1/ε_B at ε_S = 30 %</th>
          <th className="py-1 pr-3 font-medium">at 50 %</th>
          <th className="py-1 font-medium">at 70 %</th>
        </tr>
      </thead>
      <tbody>
        {series.map((s, k) => (
          <tr key={s.name} className={`border-b border-ink/5 ${k === 0 ? 'font-semibold' : ''}`}>
            <th scope="row" className="py-1 pr-3 text-left font-[inherit]">{s.name}</th>
            <td className="py-1 pr-3 tabular-nums" data-testid={k === 0 ? 'score-auc' : undefined}>{formatWithError(s.roc.auc, s.roc.aucError)}</td>
            {points(s.roc).map((w) => (
              <td key={w.signalEfficiency} className="py-1 pr-3 tabular-nums" data-testid={k === 0 ? `score-rejection-${Math.round(100 * w.signalEfficiency)}` : undefined}>
                {rejection(w)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
