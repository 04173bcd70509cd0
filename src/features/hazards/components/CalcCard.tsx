import { useId, useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import type { UseQueryResult } from '@tanstack/react-query';
import { Button } from '../../../components/ui/Button';
import { FieldError } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Glyph } from '../../../components/ui/Glyph';
import { Loading, Section } from '../../../components/ui/Page';
import { errorMessage, isApiError } from '../../../lib/api';
import type { CalcName } from '../../../contract/hazards';
import { AttachCalcResult } from './AttachCalcResult';

export interface CalcField {
  name: string;
  label: string;
  unit?: string;
  hint?: string;
  required?: boolean;
  /** A select instead of a number input. */
  options?: readonly { value: string; label: string }[];
  defaultValue?: string;
}

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

function CalcInput({ field, error, register }: { field: CalcField; error?: string; register: ReturnType<typeof useForm<Record<string, string>>>['register'] }) {
  const id = useId();
  const describedBy = [field.hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  const cls = `min-h-12 w-full min-w-0 rounded-md bg-surface px-3 text-ink ${error ? 'border-[3px] border-danger' : 'border-2 border-line'}`;
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {field.label}
        {field.unit ? <span className="font-normal"> ({field.unit})</span> : null}
        {field.required === false ? <span className="font-normal text-ink-muted"> optional</span> : null}
      </label>
      {field.hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {field.hint}
        </p>
      ) : null}
      {field.options ? (
        <select id={id} aria-invalid={error ? true : undefined} aria-describedby={describedBy} className={cls} {...register(field.name)}>
          {field.required === false ? <option value="">Not given</option> : null}
          {field.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      ) : (
        <input id={id} inputMode="decimal" autoComplete="off" aria-invalid={error ? true : undefined} aria-describedby={describedBy} className={cls} {...register(field.name)} />
      )}
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}

/** Sources and cautions a result carries; the cautions are never hidden. */
export function SourcesAndCautions({ sources, cautions }: { sources: readonly string[]; cautions: readonly string[] }) {
  return (
    <>
      {sources.length ? (
        <div>
          <h4 className="font-bold">Sources</h4>
          <ul className="list-disc pl-6 text-sm">
            {sources.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {cautions.length ? (
        <ul className="flex flex-col gap-2">
          {cautions.map((c) => (
            <li key={c} className="flex gap-2 rounded-md border-2 border-l-8 border-caution bg-caution-wash p-2">
              <Glyph shape="triangle" className="mt-1 size-4 text-caution" />
              <p>
                <span className="font-bold text-caution">Caution: </span>
                {c}
              </p>
            </li>
          ))}
        </ul>
      ) : null}
    </>
  );
}

/**
 * One engineering check: labelled inputs, the formula in words, and the server's answer with units,
 * sources and cautions. Field errors from the server (details[].path) land under the field they name.
 */
export function CalcCard<R>({
  title,
  formula,
  fields,
  useResult,
  renderResult,
  attachAs,
}: {
  title: string;
  formula: ReactNode;
  fields: readonly CalcField[];
  useResult: (inputs: Record<string, string | number> | null) => UseQueryResult<R>;
  renderResult: (result: R) => ReactNode;
  /** Offer to freeze the result on a hazard as this calculator (for people who keep the register). */
  attachAs?: CalcName;
}) {
  const form = useForm<Record<string, string>>({ defaultValues: Object.fromEntries(fields.map((f) => [f.name, f.defaultValue ?? ''])) });
  const [inputs, setInputs] = useState<Record<string, string | number> | null>(null);
  const result = useResult(inputs);
  const resultId = useId();

  const serverDetails = isApiError(result.error) ? result.error.details : [];
  const fieldError = (name: string) => form.formState.errors[name]?.message ?? serverDetails.find((d) => d.path === name)?.message;
  const unplaced = result.error && !serverDetails.some((d) => fields.some((f) => f.name === d.path)) ? errorMessage(result.error) : null;

  const submit = form.handleSubmit((values) => {
    form.clearErrors();
    let ok = true;
    const next: Record<string, string | number> = {};
    for (const f of fields) {
      const raw = (values[f.name] ?? '').trim();
      if (raw === '') {
        if (f.required !== false) {
          form.setError(f.name, { type: 'required', message: `Enter ${f.label.toLowerCase()}` });
          ok = false;
        }
        continue;
      }
      if (f.options) next[f.name] = raw;
      else if (!NUMBER.test(raw)) {
        form.setError(f.name, { type: 'number', message: 'Enter a number, for example 12.5' });
        ok = false;
      } else next[f.name] = Number(raw);
    }
    if (ok) setInputs(next);
  });

  return (
    <Section title={title}>
      <div className="mb-3 rounded-md border-2 border-line-soft bg-sunken p-3">
        <p className="font-bold">Formula in words</p>
        <div>{formula}</div>
      </div>
      <Form onSubmit={(e) => void submit(e)} aria-label={title}>
        <div className="grid gap-4 sm:grid-cols-2">
          {fields.map((f) => (
            <CalcInput key={f.name} field={f} error={fieldError(f.name)} register={form.register} />
          ))}
        </div>
        <FormActions>
          <Button type="submit" variant="primary" aria-describedby={resultId}>
            Calculate
          </Button>
        </FormActions>
      </Form>
      <div id={resultId} aria-live="polite" className="mt-4 flex flex-col gap-3">
        {inputs && result.isFetching ? <Loading label="Calculating…" /> : null}
        <FormError title="Could not calculate" message={unplaced} />
        {result.data && !result.isError ? (
          <div className="flex flex-col gap-3 rounded-md border-2 border-line p-3">
            <h3 className="text-xl font-bold">Result</h3>
            {renderResult(result.data)}
            {attachAs && inputs ? <AttachCalcResult key={JSON.stringify(inputs)} calc={attachAs} inputs={inputs} /> : null}
          </div>
        ) : null}
      </div>
    </Section>
  );
}
