import { useId, useRef, useState } from 'react';
import { Controller, get, useFieldArray, useForm, type FieldErrors as RhfErrors, type Resolver, type UseFormReturn } from 'react-hook-form';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import type { RiskMatrixInput } from '../../../contract/hazards';
import { LEVEL_GLYPHS, type RiskLevel } from '../../../domain/hazards/matrix';
import { LEVEL_PALETTE } from '../../../domain/hazards/palette';
import { ROLE_LABELS } from '../../../domain/people/roles';
import { errorMessage, isApiError } from '../../../lib/api';
import {
  ACCEPTING_ROLES,
  blankAxisRow,
  blankLevelRow,
  checkMatrixForm,
  formToInput,
  levelKeyOf,
  matrixIdOf,
  placeProblems,
  type FieldErrors,
  type MatrixFormValues,
} from '../lib/matrixForm';
import { levelClass } from '../lib/risk';
import { LevelGlyph } from './LevelGlyph';
import { RiskBadge } from './RiskBadge';
import { SelectField } from '../../../components/ui/SelectField';

const GLYPH_WORDS: Record<(typeof LEVEL_GLYPHS)[number], string> = {
  octagon: 'Octagon',
  triangle: 'Triangle',
  diamond: 'Diamond',
  circle: 'Circle',
  dash: 'Bar',
  square: 'Square',
  star: 'Star',
  hexagon: 'Hexagon',
};

/** Flat "a.1.b" paths -> the nested error object react-hook-form reads (arrays for numeric segments). */
function nest(fields: FieldErrors): RhfErrors<MatrixFormValues> {
  const out: Record<string, unknown> = {};
  for (const [path, message] of fields) {
    const parts = path.split('.');
    let node: Record<string, unknown> = out;
    parts.forEach((part, i) => {
      if (i === parts.length - 1) {
        node[part] = { type: 'matrix', message };
        return;
      }
      node[part] ??= /^\d+$/.test(parts[i + 1]) ? [] : {};
      node = node[part] as Record<string, unknown>;
    });
  }
  return out as RhfErrors<MatrixFormValues>;
}

/** Every check the server runs, run here first, each message placed at its field. */
function matrixResolver(mode: 'create' | 'edit', onGeneral: (messages: string[]) => void): Resolver<MatrixFormValues> {
  return async (values) => {
    const { fields, general } = checkMatrixForm(values, mode);
    onGeneral(general);
    if (fields.size === 0 && general.length === 0) return { values, errors: {} };
    return { values: {}, errors: nest(fields) };
  };
}

const msg = (errors: RhfErrors<MatrixFormValues>, path: string): string | undefined => (get(errors, path) as { message?: string } | undefined)?.message;

export function RiskMatrixForm({
  mode,
  initial,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  mode: 'create' | 'edit';
  initial: MatrixFormValues;
  submitLabel: string;
  /** Resolves on success; a rejection's ApiError is placed at the fields its details name. */
  onSubmit: (input: RiskMatrixInput) => Promise<unknown>;
  onCancel: () => void;
}) {
  const [general, setGeneral] = useState<string[]>([]);
  const [serverError, setServerError] = useState<string | null>(null);
  const form = useForm<MatrixFormValues>({ defaultValues: initial, resolver: matrixResolver(mode, setGeneral) });
  const { register, handleSubmit, formState, setError, setValue } = form;
  const e = formState.errors;
  const idTouched = useRef(mode === 'edit' || initial.id !== '');
  const nameField = register('name', {
    onChange: (event: { target: { value: string } }) => {
      if (!idTouched.current) setValue('id', matrixIdOf(event.target.value));
    },
  });
  const idField = register('id', { onChange: () => (idTouched.current = true) });

  const submit = handleSubmit(
    async (values) => {
      setServerError(null);
      try {
        await onSubmit(formToInput(values));
      } catch (error) {
        if (!isApiError(error)) {
          setServerError(errorMessage(error));
          return;
        }
        if (error.code === 'matrix_exists') {
          setError('id', { type: 'server', message: error.message }, { shouldFocus: true });
          return;
        }
        const { fields, general: unplaced } = placeProblems(error.details, values);
        let first = true;
        for (const [path, message] of fields) {
          setError(path as never, { type: 'server', message }, { shouldFocus: first });
          first = false;
        }
        setServerError([error.message, ...unplaced].join(' '));
      }
    },
    () => setServerError(null),
  );

  const problemCount = countErrors(e);

  return (
    <Form onSubmit={(event) => void submit(event)} aria-label={submitLabel}>
      {formState.isSubmitted && (problemCount > 0 || general.length > 0) ? (
        <Notice tone="danger" title="Not saved yet">
          <p>
            {problemCount > 0 ? `${problemCount} ${problemCount === 1 ? 'field needs' : 'fields need'} attention; each is marked below.` : null}
          </p>
          {general.length ? (
            <ul className="mt-1 list-disc pl-5">
              {general.map((g) => (
                <li key={g}>{g}</li>
              ))}
            </ul>
          ) : null}
        </Notice>
      ) : null}
      {serverError ? (
        <Notice tone="danger" title="The server did not save the matrix">
          <p>{serverError}</p>
        </Notice>
      ) : null}

      <TextField label="Name" error={msg(e, 'name')} {...nameField} />
      {mode === 'create' ? (
        <TextField
          label="Short id"
          hint="Used in links and by other tools. Lower-case letters, digits and dashes; it cannot change later."
          error={msg(e, 'id')}
          autoCapitalize="none"
          spellCheck={false}
          {...idField}
        />
      ) : null}

      <AxisEditor form={form} name="severities" legend="Severity categories" itemWord="severity category" hint="How bad the outcome could be, worst first." />
      <AxisEditor form={form} name="likelihoods" legend="Likelihood levels" itemWord="likelihood level" hint="How often it could happen, most likely first." />
      <LevelsEditor form={form} />
      <CellsEditor form={form} />

      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Saving…">
          {submitLabel}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

function countErrors(node: unknown): number {
  if (!node || typeof node !== 'object') return 0;
  if ('message' in node && typeof (node as { message: unknown }).message === 'string') return 1;
  return Object.values(node as Record<string, unknown>).reduce<number>((n, v) => n + countErrors(v), 0);
}

type Form = UseFormReturn<MatrixFormValues>;

function RowButtons({ label, index, count, onMove, onRemove }: { label: string; index: number; count: number; onMove: (to: number) => void; onRemove: () => void }) {
  return (
    <div className="flex flex-wrap gap-2">
      <Button aria-label={`Move ${label} up`} disabled={index === 0} onClick={() => onMove(index - 1)}>
        Up
      </Button>
      <Button aria-label={`Move ${label} down`} disabled={index === count - 1} onClick={() => onMove(index + 1)}>
        Down
      </Button>
      <Button variant="danger" aria-label={`Remove ${label}`} onClick={onRemove}>
        Remove
      </Button>
    </div>
  );
}

function AxisEditor({ form, name, legend, itemWord, hint }: { form: Form; name: 'severities' | 'likelihoods'; legend: string; itemWord: string; hint: string }) {
  const { control, register, formState, getValues } = form;
  const { fields, append, remove, move } = useFieldArray({ control, name, keyName: 'fieldKey' });
  const e = formState.errors;
  const hintId = useId();
  const Word = itemWord.charAt(0).toUpperCase() + itemWord.slice(1);
  return (
    <fieldset className="min-w-0 rounded-md border-2 border-line-soft p-3" aria-describedby={hintId}>
      <legend className="px-1 text-lg font-bold">{legend}</legend>
      <p id={hintId} className="mb-3 text-sm text-ink-muted">
        {hint} The key is what people quote (for example “2” or “C”).
      </p>
      <ol className="flex flex-col gap-4">
        {fields.map((field, i) => {
          const label = `${itemWord} ${i + 1}`;
          return (
            <li key={field.fieldKey} className="flex flex-col gap-3 border-b-2 border-line-soft pb-4 last:border-b-0 last:pb-0">
              <p className="font-bold">
                {Word} {i + 1}
              </p>
              <div className="grid gap-3 sm:grid-cols-[8rem_minmax(0,1fr)]">
                <TextField label={`Key of ${label}`} error={msg(e, `${name}.${i}.key`)} autoCapitalize="none" spellCheck={false} {...register(`${name}.${i}.key`)} />
                <TextField label={`Name of ${label}`} error={msg(e, `${name}.${i}.label`)} {...register(`${name}.${i}.label`)} />
              </div>
              <TextField label={`What ${label} means (optional)`} error={msg(e, `${name}.${i}.description`)} {...register(`${name}.${i}.description`)} />
              <RowButtons label={label} index={i} count={fields.length} onMove={(to) => move(i, to)} onRemove={() => remove(i)} />
            </li>
          );
        })}
      </ol>
      <FieldError id={`${hintId}-error`} message={msg(e, `${name}.root`)} />
      <Button className="mt-3" disabled={fields.length >= 10} onClick={() => append(blankAxisRow(name === 'severities' ? 'severity' : 'likelihood', getValues(name)))}>
        Add a {itemWord}
      </Button>
    </fieldset>
  );
}

function previewLevel(l: MatrixFormValues['levels'][number], i: number): RiskLevel {
  const swatch = LEVEL_PALETTE.find((s) => s.key === l.swatch);
  return { key: levelKeyOf(l.label) || `level-${i}`, label: l.label.trim() || `Level ${i + 1}`, rank: 0, colour: swatch?.colour ?? '', glyph: l.glyph || undefined };
}

function LevelsEditor({ form }: { form: Form }) {
  const { control, register, formState, getValues, setValue, watch } = form;
  const { fields, append, remove } = useFieldArray({ control, name: 'levels', keyName: 'fieldKey' });
  const e = formState.errors;
  const levels = watch('levels');
  const hintId = useId();
  const removeLevel = (i: number) => {
    const uid = getValues(`levels.${i}.uid`);
    // Cells that pointed at the removed level go back to "not chosen" rather than to a level that is gone.
    const cells = getValues('cells');
    for (const [row, cols] of Object.entries(cells)) {
      for (const [col, chosen] of Object.entries(cols)) if (chosen === uid) setValue(`cells.${row}.${col}`, '');
    }
    remove(i);
  };
  return (
    <fieldset className="min-w-0 rounded-md border-2 border-line-soft p-3" aria-describedby={hintId}>
      <legend className="px-1 text-lg font-bold">Risk levels and who accepts them</legend>
      <p id={hintId} className="mb-3 text-sm text-ink-muted">
        Each level has its own colour from a fixed palette readable in both themes, its own shape and its name, so it is never told by colour alone. A
        higher rank is worse. Choosing two roles means two different people must sign.
      </p>
      <ol className="flex flex-col gap-4">
        {fields.map((field, i) => {
          const label = `risk level ${i + 1}`;
          const current = levels[i];
          return (
            <li key={field.fieldKey} className="flex flex-col gap-3 border-b-2 border-line-soft pb-4 last:border-b-0 last:pb-0">
              <p className="flex flex-wrap items-center gap-2 font-bold">
                <span>Risk level {i + 1}</span>
                {current ? <RiskBadge level={previewLevel(current, i)} /> : null}
              </p>
              <div className="grid gap-3 sm:grid-cols-[minmax(0,1fr)_8rem]">
                <TextField label={`Name of ${label}`} error={msg(e, `levels.${i}.label`)} {...register(`levels.${i}.label`)} />
                <TextField label={`Rank of ${label}`} inputMode="numeric" error={msg(e, `levels.${i}.rank`)} {...register(`levels.${i}.rank`)} />
              </div>
              <div className="grid gap-3 sm:grid-cols-2">
                <SelectField
                  label={`Colour of ${label}`}
                  placeholder="Choose…"
                  options={LEVEL_PALETTE.map((s) => ({ value: s.key, label: s.name }))}
                  error={msg(e, `levels.${i}.swatch`)}
                  {...register(`levels.${i}.swatch`)}
                />
                <SelectField
                  label={`Shape of ${label}`}
                  placeholder="Choose…"
                  options={LEVEL_GLYPHS.map((g) => ({ value: g, label: GLYPH_WORDS[g] }))}
                  error={msg(e, `levels.${i}.glyph`)}
                  {...register(`levels.${i}.glyph`)}
                />
              </div>
              <Controller
                control={control}
                name={`levels.${i}.roles`}
                render={({ field: f, fieldState }) => (
                  <CheckboxGroup
                    legend={`Who must accept ${label}`}
                    layout="wrap"
                    options={ACCEPTING_ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
                    value={f.value}
                    onChange={f.onChange}
                    error={fieldState.error?.message}
                  />
                )}
              />
              <div>
                <Button variant="danger" aria-label={`Remove ${label}`} onClick={() => removeLevel(i)}>
                  Remove
                </Button>
              </div>
            </li>
          );
        })}
      </ol>
      <FieldError id={`${hintId}-error`} message={msg(e, 'levels.root')} />
      <Button className="mt-3" disabled={fields.length >= 8} onClick={() => append(blankLevelRow(getValues('levels')))}>
        Add a risk level
      </Button>
    </fieldset>
  );
}

function CellsEditor({ form }: { form: Form }) {
  const { register, formState, watch } = form;
  const e = formState.errors;
  const [severities, likelihoods, levels, cells] = watch(['severities', 'likelihoods', 'levels', 'cells']);
  const captionId = useId();
  const options = levels.map((l, i) => ({ value: l.uid, label: l.label.trim() || `Level ${i + 1}` }));
  const name = (entry: { key: string; label: string }, i: number, word: string) => entry.label.trim() || entry.key.trim() || `${word} ${i + 1}`;
  return (
    <fieldset className="min-w-0 rounded-md border-2 border-line-soft p-3">
      <legend className="px-1 text-lg font-bold">Level in each cell</legend>
      <div role="region" aria-labelledby={captionId} tabIndex={0} className="overflow-x-auto">
        <table className="w-full min-w-[20rem] border-separate border-spacing-1 text-left">
          <caption id={captionId} className="mb-1 text-left text-sm text-ink-muted">
            Choose the risk level for every pair: severity across, likelihood down. Every cell must be set.
          </caption>
          <thead>
            <tr>
              <td className="w-[5rem]" />
              {severities.map((s, i) => (
                <th key={s.uid} scope="col" className="min-w-[7.5rem] p-1 align-bottom text-sm leading-tight">
                  <span className="block">{s.key.trim() || '—'}</span>
                  <span className="block font-normal [overflow-wrap:anywhere]">{name(s, i, 'Severity')}</span>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {likelihoods.map((l, li) => (
              <tr key={l.uid}>
                <th scope="row" className="p-1 align-top text-sm leading-tight">
                  <span className="block">{l.key.trim() || '—'}</span>
                  <span className="block font-normal [overflow-wrap:anywhere]">{name(l, li, 'Likelihood')}</span>
                </th>
                {severities.map((s, si) => {
                  const path = `cells.${l.uid}.${s.uid}` as const;
                  const chosenUid = cells[l.uid]?.[s.uid] ?? '';
                  const at = levels.findIndex((v) => v.uid === chosenUid);
                  const chosen = at >= 0 ? previewLevel(levels[at], at) : null;
                  return (
                    <td key={s.uid} className={`rounded-sm p-1 align-top ${chosen ? levelClass(chosen) : ''}`}>
                      <div className="flex items-center gap-1">
                        {chosen ? <LevelGlyph glyph={chosen.glyph} className="size-4 shrink-0" /> : null}
                        <CellSelect
                          label={`Level for likelihood ${name(l, li, 'Likelihood')}, severity ${name(s, si, 'Severity')}`}
                          options={options}
                          error={msg(e, path)}
                          {...register(path)}
                        />
                      </div>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </fieldset>
  );
}

/** A compact select for a grid cell: the label is for assistive tech (the headers say it visually). */
function CellSelect({
  label,
  options,
  error,
  ...select
}: Omit<React.ComponentPropsWithRef<'select'>, 'id'> & { label: string; options: { value: string; label: string }[]; error?: string }) {
  const id = useId();
  return (
    <div className="flex min-w-0 flex-1 flex-col gap-1">
      <label htmlFor={id} className="sr-only">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={`min-h-12 w-full min-w-0 rounded-md bg-surface px-1 text-ink ${error ? 'border-[3px] border-danger' : 'border-2 border-line'}`}
        {...select}
      >
        <option value="">Choose…</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <span className="rounded-sm bg-surface">
        <FieldError id={`${id}-error`} message={error} />
      </span>
    </div>
  );
}
