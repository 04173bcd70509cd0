/** Labelled select and text area, shared by every feature. */
import { useId, type ComponentPropsWithRef } from 'react';
import { FieldError } from './Field';

/** A labelled select with hint and error tied by aria-describedby (react-hook-form register() friendly). */
export function SelectField({
  label,
  hint,
  error,
  options,
  placeholder,
  className = '',
  ...select
}: Omit<ComponentPropsWithRef<'select'>, 'id'> & {
  label: string;
  hint?: string;
  error?: string;
  options: readonly { value: string; label: string }[];
  placeholder?: string;
}) {
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex min-w-0 flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`min-h-12 w-full rounded-md bg-surface px-2 text-ink ${error ? 'border-[3px] border-danger' : 'border-2 border-line'}`}
        {...select}
      >
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}

export function TextAreaField({
  label,
  hint,
  error,
  className = '',
  ...area
}: Omit<ComponentPropsWithRef<'textarea'>, 'id'> & { label: string; hint?: string; error?: string }) {
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex min-w-0 flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <textarea
        id={id}
        rows={4}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`w-full rounded-md bg-surface px-3 py-2 text-ink ${error ? 'border-[3px] border-danger' : 'border-2 border-line'}`}
        {...area}
      />
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}
