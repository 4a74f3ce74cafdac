import { ErrorState } from '@/components/ui/error-state';
import { LoadingState } from '@/components/ui/loading-state';
import { Notice } from '@/components/ui/notice';
import type { Role } from '@/lib/roles';
import { useNotificationPrefs, useUpdateNotificationPrefs, type NotificationPrefs } from '../api/notification-prefs';

const kinds: { key: keyof NotificationPrefs; label: string; hint: string; roles: Role[] }[] = [
  { key: 'inspectionDigest', label: 'Digest of inspections newly due or overdue', hint: 'One e-mail after the nightly run when something new is due.', roles: ['manager'] },
  { key: 'rideReports', label: 'Severe ride reports in the digest', hint: 'Drivers’ reports of harsh stretches, when severe.', roles: ['manager'] },
  { key: 'assignments', label: 'Inspections assigned to me', hint: 'A note when an inspection is given to you.', roles: ['mechanic', 'manager'] },
];

/** The e-mail a person gets, each kind on or off. */
export function NotificationSettings({ role }: { role: Role }) {
  const prefs = useNotificationPrefs();
  const update = useUpdateNotificationPrefs();
  const mine = kinds.filter((k) => k.roles.includes(role));
  if (prefs.isPending) return <LoadingState label="Loading your e-mail settings…" />;
  if (prefs.error) return <ErrorState error={prefs.error} what="your e-mail settings" onRetry={() => void prefs.refetch()} />;
  if (!mine.length) return <p className="text-sm text-slate">There is no e-mail for your role yet.</p>;
  return (
    <fieldset className="space-y-3">
      <legend className="sr-only">E-mail you receive</legend>
      {mine.map((k) => (
        <label key={k.key} className="flex items-start gap-3 rounded-md border border-line bg-surface px-3 py-2.5">
          <input
            type="checkbox"
            className="mt-1 size-4 accent-[#D9622B]"
            checked={prefs.data[k.key]}
            disabled={update.isPending}
            onChange={(e) => update.mutate({ [k.key]: e.target.checked })}
          />
          <span>
            <span className="block font-medium text-ink">{k.label}</span>
            <span className="block text-sm text-slate">{k.hint}</span>
          </span>
        </label>
      ))}
      {update.error ? (
        <Notice tone="error" title="Not saved">
          Your change was not saved. Try again.
        </Notice>
      ) : null}
    </fieldset>
  );
}
