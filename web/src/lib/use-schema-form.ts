import { get, useForm, type DefaultValues, type FieldValues, type Path } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z, preprocess as zPreprocess } from 'zod';
import { isApiError } from './api-client';
import { sentence } from './form-errors';

/**
 * A form checked by the same zod schema the server parses the request with (server/contracts,
 * through React Hook Form's zod resolver): each field's message reads as one sentence with its
 * label ("Temporary password must be at least 10 characters."), focus goes to the first field in
 * error, and {@link SchemaForm.showServerErrors} puts the server's field messages on the same
 * fields when a request is refused.
 *
 * A field inside a list ("axles.0.tireRateNPerM") takes the label of its last part
 * (`tireRateNPerM`). `mode: 'onChange'` checks each field as it is typed rather than on submit.
 */
export function useSchemaForm<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
  labels: Partial<Record<keyof z.input<S> & string, string>> & Record<string, string | undefined>,
  defaultValues?: DefaultValues<z.input<S>>,
  options: { mode?: 'onSubmit' | 'onChange' } = {},
) {
  const form = useForm<z.input<S>, unknown, z.output<S>>({ resolver: zodResolver(schema as never) as never, defaultValues, shouldFocusError: true, ...(options.mode ? { mode: options.mode } : {}) });
  const labelOf = (path: string): string | undefined => labels[path] ?? labels[path.split('.').at(-1) ?? path];
  /** The field's error as a sentence, or undefined. */
  const errorOf = (name: Path<z.input<S>>): string | undefined => {
    const message = (get(form.formState.errors, name) as { message?: unknown } | undefined)?.message;
    return typeof message === 'string' ? sentence(labelOf(name), message) : undefined;
  };
  /** Shows the server's field errors on their fields (a whole path when the form knows its label, else its top name); true when there were any. */
  const showServerErrors = (err: unknown): boolean => {
    if (!isApiError(err)) return false;
    const fields = Object.entries(err.fields)
      .map(([path, message]) => [labelOf(path) !== undefined ? path : path.split('.')[0], message] as const)
      .filter(([name]) => labelOf(name) !== undefined);
    fields.forEach(([name, message], k) => form.setError(name as Path<z.input<S>>, { type: 'server', message }, { shouldFocus: k === 0 }));
    return fields.length > 0;
  };
  return { ...form, errorOf, showServerErrors };
}

export type SchemaForm = ReturnType<typeof useSchemaForm>;

/**
 * A number field typed as text (or a choice whose value is an id): blank is "not given" (the
 * schema's own message then says what is wanted, or `blank` when given, e.g. "Choose a depot."), a
 * decimal comma is read as a point, anything else is passed to the schema as it is.
 */
export function fromText<S extends z.ZodType>(schema: S, blank?: string) {
  return zPreprocess((v, ctx) => {
    if (typeof v !== 'string') return v;
    if (v.trim() === '') {
      if (blank) ctx.addIssue({ code: 'custom', message: blank });
      return undefined;
    }
    return Number(v.trim().replace(',', '.'));
  }, schema);
}
