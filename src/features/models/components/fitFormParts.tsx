import type { ReactNode } from 'react';
import type { FieldErrors, Path, PathValue, UseFormReturn } from 'react-hook-form';
import type { FitRequestInput } from '@shared/fits';

/** The message at a dotted path of the form's errors (zod issues land at their spec path), or one of the dataset checks. */
export function errorAt(errors: FieldErrors<FitRequestInput>, extra: Record<string, string>, path: string): string | undefined {
  if (extra[path]) return extra[path];
  let node: unknown = errors;
  for (const key of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
}

/** The first message anywhere under a path (e.g. any group's issue under "groups"). */
export function firstErrorUnder(errors: FieldErrors<FitRequestInput>, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  const seen = new Set<unknown>();
  const walk = (n: unknown): string | undefined => {
    if (n === null || typeof n !== 'object' || seen.has(n)) return undefined;
    seen.add(n);
    const m = (n as { message?: unknown }).message;
    if (typeof m === 'string') return m;
    for (const [k, v] of Object.entries(n)) if (k !== 'ref') {
      const found = walk(v);
      if (found) return found;
    }
    return undefined;
  };
  return walk(node);
}

/** A titled block of the form. */
export function FormSection({ title, hint, children }: { title: string; hint?: ReactNode; children: ReactNode }) {
  return (
    <fieldset className="space-y-3 rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <legend className="px-1 text-base font-bold text-slate-900 dark:text-white">{title}</legend>
      {hint && <p className="text-xs text-slate-600 dark:text-slate-400">{hint}</p>}
      {children}
    </fieldset>
  );
}

/** An error shown right next to the control it is about. */
export function FieldError({ id, message }: { id?: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="text-sm text-red-700 dark:text-red-300" role="alert">
      {message}
    </p>
  );
}

export const INPUT = 'rounded-md border border-slate-400 bg-white px-2 py-1 text-sm dark:border-slate-500 dark:bg-slate-900';

/** Empty input -> undefined (the schema's default applies), else a number (NaN when not one, so zod names it). */
export const optionalNumber = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v));

/**
 * Sets a value the form has no input for (a list, a record, a choice of kind) and validates the whole
 * form: the schema's cross-field rules (weights, groups, fold column) then land beside their fields
 * at once. `setValue(..., { shouldValidate })` alone validates only inputs registered under that name.
 */
export function setAndValidate<K extends Path<FitRequestInput>>(form: UseFormReturn<FitRequestInput>, name: K, value: PathValue<FitRequestInput, K>): void {
  form.setValue(name, value, { shouldDirty: true });
  void form.trigger();
}

/** What a control needs to be tied to its label and error: id, aria-invalid, aria-describedby. */
export interface ControlA11y {
  id: string;
  'aria-invalid': true | undefined;
  'aria-describedby': string | undefined;
}

/**
 * A labelled control with its error outside the <label> (so the message is not part of the control's
 * name) and tied to it by aria-describedby, with aria-invalid while it is wrong — the L1 share pattern.
 */
export function LabeledField({ id, label, error, className = '', children }: { id: string; label: string; error?: string; className?: string; children: (a11y: ControlA11y) => ReactNode }) {
  const errorId = `${id}-error`;
  return (
    <div className={`space-y-1 text-sm ${className}`}>
      <label htmlFor={id} className="block font-bold">
        {label}
      </label>
      {children({ id, 'aria-invalid': error ? true : undefined, 'aria-describedby': error ? errorId : undefined })}
      <FieldError id={errorId} message={error} />
    </div>
  );
}
