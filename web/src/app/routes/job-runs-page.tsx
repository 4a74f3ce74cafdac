import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { JobRuns } from '@/features/jobs/components/job-runs';
import { pages } from '../navigation';

export function JobRunsPage() {
  return (
    <>
      <title>Job runs · Reboundry</title>
      <PageHeader
        title="Job runs"
        back={{ to: pages.due.path, label: 'Due inspections' }}
        description="The nightly damper-duty run: history with counts, duration and errors, and a way to run it now."
        actions={
          <ButtonLink to={pages.outbox.path} variant="secondary">
            Outbox
          </ButtonLink>
        }
      />
      <JobRuns />
    </>
  );
}
