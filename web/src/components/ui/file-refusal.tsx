import { isApiError } from '@/lib/api-client';

/** Why an uploaded file was refused: the server's message and each place in the file it named. */
export function FileRefusal({ error }: { error: unknown }) {
  if (!isApiError(error)) return null;
  return (
    <div role="alert" className="rounded-md border border-overdue/50 bg-overdue-tint p-3 text-sm">
      <p className="font-semibold">{error.message}</p>
      <ul className="mt-1 list-disc pl-5">
        {Object.entries(error.fields).map(([k, v]) => (
          <li key={k}>
            {k}: {v}
          </li>
        ))}
      </ul>
    </div>
  );
}
