/** The report page's data as the report route answers it (its contract's output), and the empty draft. */
import type { ReportContent } from '@/domain/report';
import type { OutputOf } from '@/server/api/contract';
import type { getReport } from '@/server/api/routes/jobs';

export type ReportData = OutputOf<typeof getReport>;
export type Revision = ReportData['revisions'][number];
export type Candidate = ReportData['candidates'][number];

export const EMPTY: ReportContent = { analysisIds: [], conditions: {}, interpretation: '', nextSteps: [], technicianName: undefined };
