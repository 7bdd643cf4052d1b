/** The report page's data as the report route answers it, and the empty draft. */
import type { ReportContent } from '@/domain/report';
import type { AnalysisResult } from '@/signal';

export interface Revision {
  id: string;
  revision: number;
  /** Counts the saves and the signing of this revision. */
  version: number;
  status: 'draft' | 'signed';
  content: ReportContent;
  signedAt: string | null;
}
export interface Candidate {
  id: string;
  createdAt: string;
  verdict: string;
  fileName: string;
  repairOrder: string;
  jobId: string;
  result: AnalysisResult;
}
export interface ReportData {
  revisions: Revision[];
  candidates: Candidate[];
  approvals: { id: string; decision: string; typedName: string; revision: number; createdAt: string }[];
  shareLinks: { id: string; revision: number; expiresAt: string; revokedAt: string | null }[];
}

export const EMPTY: ReportContent = { analysisIds: [], conditions: {}, interpretation: '', nextSteps: [], technicianName: undefined };
