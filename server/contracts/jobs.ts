/** What the job endpoints answer, as the client reads it. */

export const JOB_RUN_STATUSES = ['running', 'succeeded', 'completed_with_errors', 'failed', 'cancelled'] as const;
export type JobRunStatus = (typeof JOB_RUN_STATUSES)[number];
export const JOB_TRIGGERS = ['schedule', 'cli', 'manual', 'test', 'seed'] as const;
export type JobTrigger = (typeof JOB_TRIGGERS)[number];

/** One run of a job in `GET /api/jobs/runs` and `/api/jobs/runs/:id`. */
export interface JobRunView {
  id: number;
  job: string;
  status: JobRunStatus;
  trigger: JobTrigger;
  asOf: string;
  requestedBy: { id: number; name: string } | null;
  startedAt: string;
  endedAt: string | null;
  /** Wall-clock duration [s]. */
  durationS: number | null;
  phase: string | null;
  progressDone: number;
  progressTotal: number;
  counts: Record<string, number>;
  errors: { item: string; message: string }[];
  errorCount: number;
  message: string | null;
}
