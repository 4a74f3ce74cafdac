import { PageHeader } from '@/components/ui/page-header';
import { OutboxView } from '@/features/outbox/components/outbox';

export function OutboxPage() {
  return (
    <>
      <title>Outbox · Reboundry</title>
      <PageHeader title="Outbox" description="Every e-mail the app has sent: managers’ digests and mechanics’ assignment notes." />
      <OutboxView />
    </>
  );
}
