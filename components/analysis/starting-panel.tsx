/**
 * The starting system as the capture shows it: each figure beside its limit and the limit's source, and what to
 * do about the battery or the starter before the compression figures are trusted.
 */
import { readingText, type StartingStatus, type StartingSystem } from '@/signal';
import { STATUS_TEXT } from './status-style';

const WORD: Record<StartingStatus, string> = { ok: '✓ within limit', low: '▼ below limit', high: '▲ above limit', 'no limit': '– no limit (enter the displacement)', 'not measured': '– not in this capture' };
const TONE: Record<StartingStatus, string> = { ok: STATUS_TEXT.ok, low: STATUS_TEXT.low, high: STATUS_TEXT.low, 'no limit': 'text-muted', 'not measured': 'text-muted' };

export function StartingPanel({ system }: { system: StartingSystem }) {
  return (
    <section aria-labelledby="starting-title" className="rounded-2xl border border-line bg-surface p-4" data-testid="starting-system">
      <h2 id="starting-title" className="text-lg font-bold">
        Battery and starter
      </h2>
      <p className="text-sm text-muted">
        {system.systemV} V system{system.engagedAtS !== null ? `; the starter engaged ${system.engagedAtS.toFixed(2)} s into the capture` : '; the capture starts with the starter already turning, so the battery at rest and the inrush are not in it'}.
        {system.inrushPeakA !== null && ` Inrush ${system.inrushPeakA.toFixed(0)} A`}
        {system.inrushMinV !== null && `, the voltage falling to ${system.inrushMinV.toFixed(2)} V as it engaged`}
        {system.inrushPeakA !== null && '.'}
      </p>
      <table className="mt-2 w-full text-sm">
        <thead>
          <tr className="text-left text-muted">
            <th className="py-1 pr-2 font-normal">Check</th>
            <th className="py-1 pr-2 font-normal">Reading</th>
            <th className="py-1 pr-2 font-normal">Limit</th>
            <th className="py-1 font-normal">Status</th>
          </tr>
        </thead>
        <tbody>
          {system.checks.filter((c) => c.status !== 'not measured').map((c) => (
            <tr key={c.key} className="border-t border-line align-top">
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                {c.label}
              </th>
              <td className="figures py-1 pr-2">{readingText(c)}</td>
              <td className="py-1 pr-2">
                <span className="figures">{c.limit}</span>
                <span className="block text-xs text-muted">{c.source}</span>
              </td>
              <td className={`py-1 font-bold ${TONE[c.status]}`}>{WORD[c.status]}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {system.notInCapture && <p className="mt-1 text-sm text-muted">{system.notInCapture}</p>}
      {system.advice.length > 0 ? (
        <ul className="mt-2 list-disc pl-5 text-sm font-bold" data-testid="starting-advice">
          {system.advice.map((a) => (
            <li key={a}>{a}</li>
          ))}
        </ul>
      ) : (
        system.customerLine && <p className="mt-2 text-sm">{system.customerLine}</p>
      )}
      <p className="mt-2 text-xs text-muted">Limits are the shop’s (Shop settings); test the battery and starter as the vehicle’s service information directs.</p>
    </section>
  );
}

