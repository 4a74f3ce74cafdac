import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { NotAvailable } from '@/components/ui/not-available';
import { useMe } from '@/features/auth/api/get-me';
import { isApiError } from '@/lib/api-client';
import { landingPaths } from '../navigation';

/** What a page shows when it cannot be shown: not for your role, not found, or broken. */
export function RouteError() {
  const error = useRouteError();
  const { data: user } = useMe();
  const home = user ? landingPaths[user.role] : '/';

  const status = isRouteErrorResponse(error) ? error.status : isApiError(error) ? error.status : 500;
  if (status === 403) {
    return (
      <>
        <title>Not available · Reboundry</title>
        <NotAvailable homePath={home} />
      </>
    );
  }
  if (status === 404) return <NotFound />;
  return (
    <div className="mx-auto max-w-xl py-10">
      <title>Something went wrong · Reboundry</title>
      <h1 className="text-2xl font-semibold tracking-tight">This page could not be shown</h1>
      <p className="mt-2 text-slate">
        {isApiError(error) ? error.message : 'Something unexpected went wrong in the app.'} Reload the page; if it keeps
        happening, tell your administrator what you were doing.
      </p>
      <p className="mt-5">
        <Link to={home} className="link font-medium">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}

export function NotFound() {
  const { data: user } = useMe();
  return (
    <div className="mx-auto max-w-xl py-10">
      <title>Not found · Reboundry</title>
      <h1 className="text-2xl font-semibold tracking-tight">There is no page at this address</h1>
      <p className="mt-2 text-slate">Check the address for a typing mistake, or start again from your start page.</p>
      <p className="mt-5">
        <Link to={user ? landingPaths[user.role] : '/'} className="link font-medium">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}
