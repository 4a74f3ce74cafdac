import { useId, type ComponentProps, type ReactNode } from 'react';
import { cx } from '@/lib/class-names';

interface FieldControlProps {
  id: string;
  'aria-describedby'?: string;
  'aria-invalid'?: true;
}

interface FieldProps {
  label: ReactNode;
  /** Short help shown under the label, tied to the control with aria-describedby. */
  hint?: ReactNode;
  /** Error text in plain words; marks the control invalid and is read out with it. */
  error?: string;
  /** Shown after the label, e.g. "(optional)". */
  aside?: ReactNode;
  className?: string;
  /** The control, given the id and ARIA attributes that tie it to its label, hint and error. */
  children: (control: FieldControlProps) => ReactNode;
}

/** A labelled form control with hint and error text, wired for screen readers. */
export function Field({ label, hint, error, aside, className, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
        {aside ? <span className="ml-1 font-normal text-slate">{aside}</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-slate">
          {hint}
        </p>
      ) : null}
      {children({ id, 'aria-describedby': describedBy, 'aria-invalid': error ? true : undefined })}
      {error ? (
        <p id={errorId} className="flex items-start gap-1.5 text-sm text-overdue">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-3.5 shrink-0 fill-current">
            <path d="M8 1 15 14H1z" />
            <rect x="7.25" y="5.5" width="1.5" height="4.5" fill="#fff" />
            <rect x="7.25" y="11" width="1.5" height="1.5" fill="#fff" />
          </svg>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}

function joinIds(...ids: Array<string | undefined>) {
  return ids.filter(Boolean).join(' ') || undefined;
}

const controlBase =
  'w-full rounded-md border bg-surface px-3 text-[0.9375rem] text-ink placeholder:text-slate/80 ' +
  'h-10 pointer-coarse:h-12 border-line-strong hover:border-slate ' +
  'aria-invalid:border-overdue aria-invalid:hover:border-overdue ' +
  'focus-visible:border-accent disabled:bg-mist disabled:text-slate';

export function Input({ className, ...rest }: ComponentProps<'input'>) {
  return <input className={cx(controlBase, className)} {...rest} />;
}

export function Select({ className, children, ...rest }: ComponentProps<'select'>) {
  return (
    <select className={cx(controlBase, 'appearance-none bg-no-repeat pr-9 select-chevron', className)} {...rest}>
      {children}
    </select>
  );
}

type TextFieldProps = Omit<ComponentProps<'input'>, 'id'> & Omit<FieldProps, 'children'>;

export function TextField({ label, hint, error, aside, className, ...input }: TextFieldProps) {
  return (
    <Field label={label} hint={hint} error={error} aside={aside} className={className}>
      {(control) => <Input {...input} {...control} aria-describedby={joinIds(control['aria-describedby'], input['aria-describedby'])} />}
    </Field>
  );
}

export interface Option {
  value: string;
  label: string;
}

type SelectFieldProps = Omit<ComponentProps<'select'>, 'id'> &
  Omit<FieldProps, 'children'> & { options: Option[] };

export function SelectField({ label, hint, error, aside, className, options, ...select }: SelectFieldProps) {
  return (
    <Field label={label} hint={hint} error={error} aside={aside} className={className}>
      {(control) => (
        <Select {...select} {...control} aria-describedby={joinIds(control['aria-describedby'], select['aria-describedby'])}>
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </Select>
      )}
    </Field>
  );
}

/**
 * A labelled picker for one CSV file. `onPick` gets the chosen file (or null when cleared), so the
 * caller can drop any preview of the previous file.
 */
export function CsvFileField({ label, onPick }: { label: string; onPick: (file: File | null) => void }) {
  return (
    <Field label={label}>
      {(c) => <Input {...c} type="file" accept=".csv,text/csv,text/plain" className="pt-1.5" onChange={(e) => onPick(e.target.files?.[0] ?? null)} />}
    </Field>
  );
}
