/**
 * The figures beneath the chart: the figure with its 90 % interval, the raw figure (A, V or rpm), the time through
 * each event on crank speed, the plain index, events used and rejected, and the cycle-to-cycle spread.
 */
import { type AnalysisResult, type CylinderResult, intervalText, percentText, RAW_LABELS } from '@/signal';
import { STATUS_TEXT } from './status-style';

export function ResultsTable({ cylinders, rawUnit }: { cylinders: CylinderResult[]; rawUnit: AnalysisResult['rawUnit'] }) {
  const stroke = cylinders.some((c) => c.strokeMs !== undefined);
  return (
    <div className="overflow-x-auto rounded-xl border border-line">
      <table className="w-full text-right">
        <caption className="sr-only">Per-cylinder figures</caption>
        <thead className="bg-raised text-sm">
          <tr>
            <th scope="col" className="px-3 py-2 text-left">Cylinder</th>
            <th scope="col" className="px-3 py-2">Relative compression</th>
            <th scope="col" className="px-3 py-2">90 % interval</th>
            <th scope="col" className="px-3 py-2 text-left">Status</th>
            <th scope="col" className="px-3 py-2">{RAW_LABELS[rawUnit]}</th>
            {stroke && <th scope="col" className="px-3 py-2">Compression stroke</th>}
            <th scope="col" className="px-3 py-2">Plain index</th>
            <th scope="col" className="px-3 py-2">Cycle spread</th>
            <th scope="col" className="px-3 py-2">Events used</th>
            <th scope="col" className="px-3 py-2">Rejected</th>
          </tr>
        </thead>
        <tbody className="figures">
          {cylinders.map((c) => (
            <tr key={c.cylinder} className="border-t border-line" data-testid={`row-${c.cylinder}`}>
              <th scope="row" className="px-3 py-2 text-left font-sans">
                {c.cylinder}
              </th>
              <td className="px-3 py-2">{percentText(c.relativePercent)} %</td>
              <td className="px-3 py-2">{intervalText(c.interval)} %</td>
              <td className={`px-3 py-2 text-left font-sans font-bold ${STATUS_TEXT[c.status]}`} data-testid="status">
                {c.status}
              </td>
              <td className="px-3 py-2">
                {c.raw.toFixed(1)} {rawUnit}
              </td>
              {stroke && <td className="px-3 py-2">{c.strokeMs === undefined ? '—' : `${c.strokeMs.toFixed(1)} ms`}</td>}
              <td className="px-3 py-2">{percentText(c.plainPercent)} %</td>
              <td className="px-3 py-2">± {c.spreadPercent.toFixed(1)} points</td>
              <td className="px-3 py-2">{c.events}</td>
              <td className="px-3 py-2">{c.rejected}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="border-t border-line px-3 py-2 text-sm text-muted" data-testid="table-legend">
        Relative compression and its 90 % interval are in % of the healthy cylinders; the spread and the limits’ distances are in percentage points. Plain
        index: the raw measurement over the strongest cylinder’s, in %, without the engine model (a check on the figure). Cycle spread: how far the
        per-cycle figures scatter (one standard deviation, points).
      </p>
    </div>
  );
}
