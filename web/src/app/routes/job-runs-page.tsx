import { PageHeader } from '@/components/ui/page-header';
import { JobRuns } from '@/features/jobs/components/job-runs';

export function JobRunsPage() {
  return (
    <>
      <title>Job runs · Reboundry</title>
      <PageHeader title="Job runs" description="The nightly damper-duty run: history with counts, duration and errors, and a way to run it now." />
      <JobRuns />
    </>
  );
}
