import { useId, useRef } from 'react';
import { Button } from '../../../components/ui/Button';
import { FieldError } from '../../../components/ui/Field';

/**
 * An editable list of short texts (causes, effects, energies). Each line has its own label and a remove
 * button named after it; "Add" puts focus in the new line.
 */
export function ListEditor({
  legend,
  itemLabel,
  value,
  onChange,
  error,
  hint,
}: {
  legend: string;
  itemLabel: string;
  value: readonly string[];
  onChange: (next: string[]) => void;
  error?: string;
  hint?: string;
}) {
  const id = useId();
  const listRef = useRef<HTMLOListElement>(null);
  const add = () => {
    onChange([...value, '']);
    requestAnimationFrame(() => {
      const inputs = listRef.current?.querySelectorAll('input');
      inputs?.[inputs.length - 1]?.focus();
    });
  };
  return (
    <fieldset className="min-w-0" aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}>
      <legend className="mb-1 font-bold">{legend}</legend>
      {hint ? (
        <p id={`${id}-hint`} className="mb-1 text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <ol ref={listRef} className="flex flex-col gap-2">
        {value.map((item, i) => (
          <li key={i} className="flex items-stretch gap-2">
            <label htmlFor={`${id}-${i}`} className="sr-only">
              {itemLabel} {i + 1}
            </label>
            <span aria-hidden="true" className="flex w-6 shrink-0 items-center justify-end font-bold text-ink-muted">
              {i + 1}.
            </span>
            <input
              id={`${id}-${i}`}
              value={item}
              onChange={(e) => onChange(value.map((v, j) => (j === i ? e.target.value : v)))}
              className="min-h-12 w-full min-w-0 rounded-md border-2 border-line bg-surface px-3 text-ink"
            />
            <Button aria-label={`Remove ${itemLabel.toLowerCase()} ${i + 1}`} onClick={() => onChange(value.filter((_, j) => j !== i))}>
              Remove
            </Button>
          </li>
        ))}
      </ol>
      {value.length === 0 ? <p className="text-ink-muted">None listed.</p> : null}
      <Button className="mt-2" onClick={add}>
        Add {itemLabel.toLowerCase()}
      </Button>
      <FieldError id={`${id}-error`} message={error} />
    </fieldset>
  );
}
