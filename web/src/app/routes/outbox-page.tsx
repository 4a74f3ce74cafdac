import { PageHeader } from '@/components/ui/page-header';
import { pages } from '../navigation';
import { OutboxView } from '@/features/outbox/components/outbox';

export function OutboxPage() {
  return (
    <>
      <title>Outbox · Reboundry</title>
      <PageHeader title="Outbox" back={{ to: pages.due.path, label: 'Due inspections' }} description="Every e-mail the app has sent: managers’ digests and mechanics’ assignment notes." />
      <OutboxView />
    </>
  );
}
