import { data, redirect, type LoaderFunctionArgs } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { meQueryOptions } from '@/features/auth/api/get-me';
import type { Role, SignedInUser } from '@/lib/roles';
import { choosePasswordPath, landingPaths } from './navigation';

/** `/sign-in?next=/vehicles%3Fstatus%3Dworkshop` for the page that was asked for. */
export function signInPath(url: string | URL): string {
  const u = new URL(url);
  const here = u.pathname + u.search;
  return here === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(here)}`;
}

/** Marks a route error as "your role may not use this" (rendered as the not-available page). */
const NOT_AVAILABLE = 'not_available_for_role';

/** The signed-in user; anyone else goes to sign-in, and someone with a temporary password to choose their own. */
async function signedIn(queryClient: QueryClient, request: Request): Promise<SignedInUser> {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) throw redirect(signInPath(request.url));
  if (user.mustChangePassword) throw redirect(choosePasswordPath);
  return user;
}

/** Loader for the page that replaces a temporary password: only for someone who has one. */
export function requireTemporaryPassword(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) throw redirect(signInPath(request.url));
    if (!user.mustChangePassword) throw redirect(landingPaths[user.role]);
    return user;
  };
}

/** Loader for the signed-in part of the app: sends anyone not signed in to sign-in. */
export function requireUser(queryClient: QueryClient) {
  return ({ request }: LoaderFunctionArgs) => signedIn(queryClient, request);
}

/** Loader for a page only some roles may use: others get a 403 route error. */
export function requireRole(queryClient: QueryClient, roles: readonly Role[]) {
  return async ({ request }: LoaderFunctionArgs) => {
    const user = await signedIn(queryClient, request);
    if (!roles.includes(user.role)) throw data({ code: NOT_AVAILABLE }, { status: 403 });
    return user;
  };
}

/** The app's root address sends each role to its own start page. */
export function landingRedirect(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const user = await signedIn(queryClient, request);
    return redirect(landingPaths[user.role]);
  };
}
