import { useNavigate } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { ChoosePasswordPage } from '@/features/auth/components/choose-password-page';
import { landingPaths } from '../navigation';

/** The forced password change; once chosen, the person goes on to their start page. */
export function ChoosePasswordRoute() {
  const { data: user } = useMe();
  const navigate = useNavigate();
  if (!user) return null;
  return (
    <ChoosePasswordPage
      user={user}
      onChosen={() => navigate(landingPaths[user.role], { replace: true })}
      onSignedOut={() => navigate('/sign-in', { replace: true, state: { notice: 'You are signed out.' } })}
    />
  );
}
