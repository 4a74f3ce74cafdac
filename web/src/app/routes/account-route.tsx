import { Section } from '@/components/ui/section';
import { useMe } from '@/features/auth/api/get-me';
import { AccountPage } from '@/features/auth/components/account-page';
import { NotificationSettings } from '@/features/notifications/components/notification-settings';

/** The account page with the person's e-mail settings below it. */
export function AccountRoute() {
  const { data: user } = useMe();
  return (
    <>
      <AccountPage />
      {user ? (
        <Section title="E-mail" description="Choose which e-mail you get. Each kind can be turned off.">
          <NotificationSettings role={user.role} />
        </Section>
      ) : null}
    </>
  );
}
