/** Renders report data to PDF bytes (no database: the benchmark and tests call it directly). */
import { renderToBuffer } from '@react-pdf/renderer';
import { createElement } from 'react';
import { registerPdfFonts } from './fonts';
import { ReportDocument, type ReportPdfData } from './report-document';

export async function renderReportPdf(data: ReportPdfData): Promise<Buffer> {
  registerPdfFonts();
  return renderToBuffer(createElement(ReportDocument, { d: data }) as Parameters<typeof renderToBuffer>[0]);
}
