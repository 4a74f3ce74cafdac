import { useLocation, useNavigate, useSearchParams } from 'react-router';
import { SignInPage } from '@/features/auth/components/sign-in-page';
import type { SignedInUser } from '@/lib/roles';
import { landingPaths, safeNext } from '../navigation';

export function SignInRoute() {
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const location = useLocation();
  const notice = (location.state as { notice?: string } | null)?.notice;

  function onSignedIn(user: SignedInUser) {
    navigate(safeNext(search.get('next')) ?? landingPaths[user.role], { replace: true });
  }

  return <SignInPage onSignedIn={onSignedIn} notice={notice} />;
}
