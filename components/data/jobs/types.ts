import type { JobStatus } from '@/domain/job';

/** A job row as the jobs route returns it. */
export interface JobRow {
  id: string;
  repairOrder: string;
  odometer: number | null;
  odometerUnit: string;
  concern: string;
  status: JobStatus;
  /** Captures with no saved analysis. */
  unanalysed: number;
  /** Whether a revision of the job's report is signed. */
  signedReport: boolean;
  createdAt: string;
  updatedAt: string;
  vehicle: { id: string; vin: string | null; year: number | null; make: string; model: string; engine: { cylinders: number; layout: string; firingOrder: number[] } };
}
