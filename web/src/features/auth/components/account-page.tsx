import { Facts } from '@/components/ui/facts';
import { PageHeader } from '@/components/ui/page-header';
import { Section } from '@/components/ui/section';
import { roleLabels } from '@/lib/roles';
import { useMe } from '../api/get-me';
import { ChangePasswordForm } from './change-password-form';

export function AccountPage() {
  const { data: user } = useMe();
  return (
    <>
      <title>Account · Reboundry</title>
      <PageHeader title="Your account" description="Who you are signed in as, and your password." />
      {user ? (
        <Section title="Details">
          <Facts
            className="sm:gap-x-12"
            columns="grid-cols-2 sm:grid-cols-[repeat(3,max-content)]"
            items={[
              { label: 'Name', value: user.name },
              { label: 'E-mail', value: user.email },
              { label: 'Role', value: roleLabels[user.role] },
            ]}
          />
          <p className="mt-3 text-sm text-slate">A fleet manager can change your name or role.</p>
        </Section>
      ) : null}
      <Section title="Change password">
        <ChangePasswordForm />
      </Section>
    </>
  );
}
