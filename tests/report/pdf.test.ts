/**
 * The report PDF read back with poppler's pdftotext (an independent PDF reader): every required section and the
 * same numbers as the analysis; its first page rendered by pdftoppm is kept in artifacts/.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderReportPdf } from '@/server/pdf/render';
import { sampleReportData } from './sample-report';

const hasPoppler = (() => {
  try {
    execFileSync('pdftotext', ['-v'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();
if (!hasPoppler) console.warn('NOTICE: pdftotext (poppler-utils) not found; the PDF text checks are skipped.');

describe.skipIf(!hasPoppler)('report PDF', () => {
  it('holds every section, the numbers of the analysis, page numbers, and renders a first page', async () => {
    const data = sampleReportData();
    const pdf = await renderReportPdf(data);
    mkdirSync('artifacts', { recursive: true });
    writeFileSync('artifacts/report.pdf', pdf);
    const text = execFileSync('pdftotext', ['-layout', 'artifacts/report.pdf', '-']).toString();
    for (const section of [
      'Demo Engine Clinic',
      'Relative compression report',
      'Vehicle',
      'Customer concern',
      'Test conditions',
      'Per-cylinder result',
      'Trace excerpt',
      'Figures',
      'Verdict',
      'Interpretation',
      'Recommended next steps',
      'Before and after',
      'Cautions and limits of this test',
      'Traceability',
      'Page 1 of',
    ]) {
      expect(text, section).toContain(section);
    }
    const r = data.analyses[0].result;
    for (const c of r.cylinders) expect(text).toContain(`${c.relativePercent!.toFixed(1)} %`);
    expect(text).toContain(`${r.crankingRpm} rpm`);
    expect(text).toContain(r.engineVersion);
    expect(text).toContain('a'.repeat(64));
    expect(text).toContain('not recorded'); // missing conditions are said, never invented
    expect(text).toContain('1CPDEM0V2ZR000101');
    // The cylinders a gauge test should confirm are listed (issue 22, point 5).
    const low = r.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder);
    expect(low.length).toBeGreaterThan(0);
    expect(text.replace(/\s+/g, ' ')).toContain(`To confirm with a gauge compression test: cylinder${low.length > 1 ? 's' : ''} ${low.join(', ')} (read low)`);
    execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', 'artifacts/report.pdf', 'artifacts/report-page']);
    expect(existsSync('artifacts/report-page-1.png')).toBe(true);
  }, 60_000);

  it('draws whatever a user typed: accents, quotes, CJK and emoji come back out of the PDF, line by line', async () => {
    const data = sampleReportData();
    const concern = 'Rough idle — “shakes” at 100% cold, ü\n二行目 한국 かな 🚗';
    const pdf = await renderReportPdf({ ...data, concern });
    writeFileSync('artifacts/report-unicode.pdf', pdf);
    // pdftotext reads each glyph back through the font's own character map: a glyph the fonts lack comes back
    // as something else (it did: "Œ" for 二 before the fallback fonts).
    const text = execFileSync('pdftotext', ['artifacts/report-unicode.pdf', '-']).toString();
    expect(text).toContain('Rough idle — “shakes” at 100% cold, ü');
    expect(text).toContain('二行目 한국 かな 🚗');
  }, 60_000);
});
