import { isApiError } from '@/lib/api-client';
import { Button } from './button';
import { Notice } from './notice';
import { NotAvailable } from './not-available';

/**
 * What went wrong loading a part of a page, in plain words, with a way to try again. A 403 for
 * another depot's work says so; any other 403 becomes the "not available for your role" page; a
 * 401 is handled globally (back to sign-in).
 */
export function ErrorState({ error, what = 'this', onRetry }: { error: unknown; what?: string; onRetry?: () => void }) {
  if (isApiError(error) && error.status === 403 && error.code === 'other_depot') {
    return (
      <Notice tone="error" title={`Not your depot’s work`} className="my-4">
        <p>{error.message} Mechanics see the inspections of their own depot and those assigned to them; ask a fleet manager to assign it to you if you are to do it.</p>
      </Notice>
    );
  }
  if (isApiError(error) && error.status === 403) return <NotAvailable />;
  const notFound = isApiError(error) && error.status === 404;
  const message = isApiError(error)
    ? error.message
    : 'Something unexpected went wrong in the app. Reload the page; if it keeps happening, tell your administrator.';
  return (
    <Notice tone="error" title={notFound ? `Could not find ${what}` : `Could not load ${what}`} className="my-4">
      <p>{message}</p>
      {onRetry && !notFound ? (
        <Button size="sm" className="mt-2" onClick={onRetry}>
          Try again
        </Button>
      ) : null}
    </Notice>
  );
}
