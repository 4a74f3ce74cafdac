import type { $ZodError, $ZodType, output } from 'zod/v4/core';
import { safeParse } from 'zod/v4/core';
import { isApiError } from './api-client';

/**
 * Field messages from the server and from zod come as fragments ("is required", "must be at
 * least 10 characters"); with the field's label they read as a sentence: "Name is required."
 */
export type FieldErrors = Record<string, string>;

export function sentence(label: string | undefined, message: string): string {
  const text = /^[A-Z]/.test(message) || !label ? message : `${label} ${message}`;
  const capital = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

export function zodFieldErrors(error: $ZodError, labels: Record<string, string>): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? '_');
    if (!out[key]) out[key] = sentence(labels[key], issue.message);
  }
  return out;
}

export function serverFieldErrors(error: unknown, labels: Record<string, string>): FieldErrors {
  if (!isApiError(error)) return {};
  const out: FieldErrors = {};
  for (const [key, message] of Object.entries(error.fields)) {
    const top = key.split('.')[0];
    if (!out[top]) out[top] = sentence(labels[top], message);
  }
  return out;
}

/**
 * Server field errors keyed by their whole path ("corners.0.adhesionPct"), each as one sentence
 * that starts with the field's label ("Adhesion FL must be 0–100 %."). `labelOf` names the field
 * a path belongs to; paths it does not know keep the server's words under the form's own key `_`.
 */
export function serverPathErrors(error: unknown, labelOf: (path: string) => string | undefined): FieldErrors {
  if (!isApiError(error)) return {};
  const out: FieldErrors = {};
  for (const [path, message] of Object.entries(error.fields)) {
    const label = labelOf(path);
    const key = label ? path : '_';
    if (!out[key]) out[key] = sentence(label, message);
  }
  return out;
}

/** Puts keyboard focus on the first field (in form order) that has an error. */
export function focusFirstError(form: HTMLFormElement | null, errors: FieldErrors) {
  if (!form) return;
  for (const el of Array.from(form.elements)) {
    const name = (el as HTMLInputElement).name;
    if (name && errors[name]) {
      (el as HTMLElement).focus();
      return;
    }
  }
}

/** Shows `errors` on the form's fields (`show`, with {} to clear them) and puts focus on the first field at fault. */
export function showFieldErrors(form: HTMLFormElement | null, errors: FieldErrors, show: (errors: FieldErrors) => void) {
  show(errors);
  focusFirstError(form, errors);
}

/**
 * A form's values checked by the zod schema the server parses them with: the parsed data, with
 * the fields' errors cleared; or null, with each field's first problem shown as a sentence with
 * its label and focus on the first field at fault.
 */
export function checkedFormValues<S extends $ZodType>(
  schema: S,
  values: unknown,
  labels: Record<string, string>,
  form: HTMLFormElement | null,
  show: (errors: FieldErrors) => void,
): output<S> | null {
  const parsed = safeParse(schema, values);
  if (!parsed.success) {
    showFieldErrors(form, zodFieldErrors(parsed.error, labels), show);
    return null;
  }
  show({});
  return parsed.data;
}
