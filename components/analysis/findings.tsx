/** Where the eye lands after the chart: the verdict, the pattern hint with next tests, and the warnings. */
import { type AnalysisResult, METHOD_NAMES, VERDICT_WORDS } from '@/signal';
import { STATUS_SIGN, STATUS_TEXT } from './status-style';

/** `onTryCylinders` re-reads the capture as an engine of that many cylinders (offered when the capture contradicts the setup). */
export function Findings({ result, onTryCylinders }: { result: AnalysisResult; onTryCylinders?: (cylinders: number) => void }) {
  return (
    <div className="flex flex-col gap-3">
      <p className={`text-lg font-bold ${STATUS_TEXT[result.verdict]}`} data-testid="verdict">
        {STATUS_SIGN[result.verdict]} {VERDICT_WORDS[result.verdict]}.
      </p>
      {result.quality && (
        <p data-testid="quality">
          Capture quality: <strong>{result.quality.grade}</strong>
          {result.quality.limitedBy !== 'none' ? ` — limited by ${result.quality.limitedBy}. ` : '. '}
          {result.quality.note}
        </p>
      )}
      <p>{result.pattern.hint}</p>
      {result.pattern.nextTests.length > 0 && (
        <div>
          <h3 className="font-bold">Next tests</h3>
          <ol className="list-decimal pl-6">
            {result.pattern.nextTests.map((t) => (
              <li key={t}>{t}</li>
            ))}
          </ol>
        </div>
      )}
      {result.crossCheck && (
        <p className={result.crossCheck.agree ? '' : 'font-bold text-low'}>
          Cross-check with the {METHOD_NAMES[result.crossCheck.method]} method:{' '}
          {result.crossCheck.agree ? 'the two methods agree' : 'the two methods disagree'} (largest difference <span className="figures">{result.crossCheck.maxDifference}</span> points).
        </p>
      )}
      {result.warnings.length > 0 && (
        <div>
          <h3 className="font-bold">Warnings</h3>
          <ul className="flex flex-col gap-2" data-testid="warnings">
            {result.warnings.map((w, i) => (
              <li key={i} className="rounded-lg border-l-4 border-uncertain bg-raised p-2">
                <span className="figures mr-2 text-sm text-muted">{w.code}</span>
                {w.message}
                {w.cylinders !== undefined && onTryCylinders && (
                  <button type="button" className="ml-2 rounded-md border border-brand px-2 py-0.5 text-sm font-bold text-brand" onClick={() => onTryCylinders(w.cylinders!)}>
                    Read as {w.cylinders} cylinders
                  </button>
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
