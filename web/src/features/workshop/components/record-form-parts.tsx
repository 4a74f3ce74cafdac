import type { ReactNode } from 'react';
import { Notice } from '@/components/ui/notice';
import type { FieldErrors } from '@/lib/form-errors';
import { formatNumber } from '@/lib/format';

/** The plain inputs of the inspection's forms (those not drawn by the shared fields). */
export const inputCls = 'min-h-11 w-full rounded border border-line bg-surface px-3 text-base tabular focus-visible:outline-2 focus-visible:outline-accent';

/** A figure typed with a point or a comma; empty is null (NaN when it is not a number). */
export const num = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));
export const isNumber = (s: string) => s.trim() !== '' && Number.isFinite(Number(s.replace(',', '.')));

/** Millimetres without a trailing .0 for whole values. */
export const mm = (v: number) => formatNumber(v, Number.isInteger(v) ? 0 : 1);

/** Says that a saved draft of the form was brought back, with a button to put the notice away. */
export function DraftRestoredNotice({ onDismiss, children }: { onDismiss: () => void; children: ReactNode }) {
  return (
    <Notice tone="info" title="Draft restored" className="mb-3">
      {children}{' '}
      <button type="button" className="link" onClick={onDismiss}>
        OK
      </button>
    </Notice>
  );
}

/** After a save that did not go through: the form's own errors first, otherwise what the server said. */
export function NotSavedNotice({ errors, failure }: { errors: FieldErrors; failure: Error | null }) {
  if (Object.keys(errors).length) {
    return (
      <Notice tone="error" className="mt-3" title="Not saved">
        {errors._ ?? 'Check the fields marked in red, then save again.'}
      </Notice>
    );
  }
  return failure ? (
    <Notice tone="error" className="mt-3" title="Not saved">
      {failure.message}
    </Notice>
  ) : null;
}
