import { useId, useState, type ComponentPropsWithRef, type ReactNode } from 'react';

export interface TextFieldProps extends Omit<ComponentPropsWithRef<'input'>, 'id'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  /** Adds a Show/Hide button so a long password can be checked on a phone keyboard. */
  revealable?: boolean;
}

/** A labelled input whose hint and error are tied to it with aria-describedby. */
export function TextField({ label, hint, error, revealable = false, type = 'text', className = '', ...input }: TextFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const [revealed, setRevealed] = useState(false);
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  const inputType = revealable && revealed ? 'text' : type;

  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <div className="flex items-stretch gap-2">
        <input
          id={id}
          type={inputType}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className={
            'min-h-12 w-full min-w-0 rounded-md border-2 bg-surface px-3 py-2 text-base text-ink placeholder:italic placeholder:text-ink-muted ' +
            (error ? 'border-danger border-[3px]' : 'border-line')
          }
          {...input}
        />
        {revealable ? (
          <button
            type="button"
            className="min-h-12 min-w-16 shrink-0 rounded-md border-2 border-line bg-surface px-3 font-bold text-ink hover:bg-selected"
            aria-pressed={revealed}
            aria-controls={id}
            onClick={() => setRevealed((v) => !v)}
          >
            {revealed ? 'Hide' : 'Show'}
          </button>
        ) : null}
      </div>
      <FieldError id={errorId} message={error} />
    </div>
  );
}

/** An error line under a field or group: a word-bearing glyph plus the message, announced when it appears. */
export function FieldError({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} role="alert" className="flex items-start gap-1.5 font-bold text-danger">
      <svg viewBox="0 0 16 16" aria-hidden="true" className="mt-1 size-4 shrink-0">
        <path d="M8 1l7 7-7 7-7-7z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
        <path d="M8 4.6v4.2" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        <circle cx="8" cy="11" r="1.1" fill="currentColor" />
      </svg>
      <span>
        <span className="sr-only">Error: </span>
        {message}
      </span>
    </p>
  );
}

export interface CheckboxOption<V extends string> {
  value: V;
  label: string;
  description?: string;
}

export interface CheckboxGroupProps<V extends string> {
  legend: string;
  /** Hide the legend visually (e.g. inside a table row whose heading already names it). */
  legendHidden?: boolean;
  options: readonly CheckboxOption<V>[];
  value: readonly V[];
  onChange: (next: V[]) => void;
  error?: string;
  disabled?: boolean;
  layout?: 'stack' | 'wrap';
}

/** A fieldset of checkboxes bound to an array value (used for roles). */
export function CheckboxGroup<V extends string>({
  legend,
  legendHidden = false,
  options,
  value,
  onChange,
  error,
  disabled,
  layout = 'stack',
}: CheckboxGroupProps<V>) {
  const id = useId();
  const errorId = `${id}-error`;
  const toggle = (option: V, checked: boolean) => {
    const next = checked ? [...value, option] : value.filter((v) => v !== option);
    // Keep the options' order so the value is stable whatever the click order was.
    onChange(options.map((o) => o.value).filter((v) => next.includes(v)));
  };
  return (
    <fieldset aria-describedby={error ? errorId : undefined} aria-invalid={error ? true : undefined} className="min-w-0">
      <legend className={legendHidden ? 'sr-only' : 'mb-1 font-bold'}>{legend}</legend>
      <div className={layout === 'wrap' ? 'flex flex-wrap gap-x-4 gap-y-1' : 'flex flex-col gap-1'}>
        {options.map((option) => (
          <label key={option.value} className="flex min-h-11 cursor-pointer items-center gap-2.5 py-1">
            <input
              type="checkbox"
              name={`${id}-${option.value}`}
              checked={value.includes(option.value)}
              disabled={disabled}
              onChange={(event) => toggle(option.value, event.target.checked)}
            />
            <span>
              <span className={layout === 'wrap' ? 'whitespace-nowrap' : 'font-bold'}>{option.label}</span>
              {option.description ? <span className="block text-sm text-ink-muted">{option.description}</span> : null}
            </span>
          </label>
        ))}
      </div>
      <FieldError id={errorId} message={error} />
    </fieldset>
  );
}
