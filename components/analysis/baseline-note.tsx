/** This capture beside the shop's healthy captures of the same engine, in plain sentences (domain/baseline.ts). */
import { type Baseline, baselineSentences } from '@/domain/baseline';
import type { AnalysisResult } from '@/signal';

export function BaselineNote({ result, baseline }: { result: AnalysisResult; baseline: Baseline }) {
  const sentences = baselineSentences(result, baseline);
  if (!sentences.length) return null;
  return (
    <section aria-labelledby="baseline-title" className="rounded-2xl border border-line bg-surface p-4" data-testid="baseline">
      <h2 id="baseline-title" className="text-lg font-bold">
        Against this shop’s healthy captures
      </h2>
      <ul className="mt-1 list-disc pl-5 text-sm">
        {sentences.map((s) => (
          <li key={s}>{s}</li>
        ))}
      </ul>
      <p className="mt-1 text-xs text-muted">From the analyses in this shop’s signed reports that read healthy, on engines like this one (10th to 90th percentile).</p>
    </section>
  );
}
