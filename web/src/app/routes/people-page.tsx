import { useMe } from '@/features/auth/api/get-me';
import { UsersAdmin } from '@/features/users/components/users-admin';

export function PeoplePage() {
  const { data: user } = useMe();
  return user ? <UsersAdmin currentUserId={user.id} /> : null;
}
