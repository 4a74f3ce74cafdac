import { isApiError } from '@/lib/api-client';
import { Notice } from './notice';

/**
 * Why a request the person just made failed, as an error notice titled `title`: the server's
 * message, or "try again" when the failure is not the server's answer. Nothing while the request
 * has not failed; with `fieldsShownOnForm`, nothing either when the server named fields, since the
 * form then shows each message at its field.
 */
export function RequestProblem({
  request,
  title,
  fieldsShownOnForm = false,
  className,
}: {
  request: { isError: boolean; error: unknown };
  title: string;
  fieldsShownOnForm?: boolean;
  className?: string;
}) {
  const { isError, error } = request;
  if (!isError || (fieldsShownOnForm && isApiError(error) && Object.keys(error.fields).length > 0)) return null;
  return (
    <Notice tone="error" title={title} className={className}>
      {isApiError(error) ? error.message : 'Something unexpected went wrong. Try again.'}
    </Notice>
  );
}
