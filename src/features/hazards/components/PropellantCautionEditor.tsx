import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useFieldArray, useForm, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import type { PropellantDto } from '../../../contract/hazards';
import { errorMessage, isApiError } from '../../../lib/api';
import { propellantCautionsInputSchema, useUpdatePropellantCautions, type PropellantCautionsInput } from '../api/updatePropellantCautions';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';

type Values = PropellantCautionsInput;
type Output = z.output<typeof propellantCautionsInputSchema>;

const SOURCE_HINT = 'A standard, your site rules, a data sheet, or “common practice, no source”.';

/** A key no other item has; keys only tie history lines together, people never see them. */
function freshKey(existing: readonly { key: string }[]): string {
  const used = new Set(existing.map((c) => c.key));
  let n = existing.length + 1;
  while (used.has(`team-${n}`)) n += 1;
  return `team-${n}`;
}

const SERVER_PATH = /^(cautions|ppe)(\.\d+\.(key|severity|text|source))?$/;

/**
 * The safety officer's editor for one propellant's cautions and PPE: add, reword, re-source, reorder and
 * remove, each item with its source. Validated with the contract's schema, the one the server uses.
 */
export function PropellantCautionEditor({ propellant, onDone }: { propellant: PropellantDto; onDone: () => void }) {
  const update = useUpdatePropellantCautions();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<Values, unknown, Output>({
    resolver: zodResolver(propellantCautionsInputSchema),
    defaultValues: { cautions: propellant.cautions.map((c) => ({ ...c })), ppe: propellant.ppe.map((p) => ({ ...p })) },
  });
  const { control, register, handleSubmit, formState, setError, getValues } = form;
  const cautions = useFieldArray({ control, name: 'cautions', keyName: 'fieldKey' });
  const ppe = useFieldArray({ control, name: 'ppe', keyName: 'fieldKey' });
  const e = formState.errors;

  const submit = handleSubmit(async (input) => {
    setFormError(null);
    try {
      await update.mutateAsync({ id: propellant.id, input });
      onDone();
    } catch (error) {
      if (!isApiError(error)) return setFormError(errorMessage(error));
      let unplaced = error.details.length === 0;
      for (const d of error.details) {
        if (SERVER_PATH.test(d.path)) setError((d.path.includes('.') ? d.path : `${d.path}.root`) as FieldPath<Values>, { type: 'server', message: d.message });
        else unplaced = true;
      }
      setFormError(unplaced ? error.message : null);
    }
  });

  return (
    <Form onSubmit={(event) => void submit(event)} aria-label="Edit cautions and PPE">
      <FormError title="Not saved" message={formError} />
      <fieldset className="min-w-0 rounded-md border-2 border-line-soft p-3">
        <legend className="px-1 text-lg font-bold">Warnings and cautions</legend>
        <p className="mb-3 text-sm text-ink-muted">A warning is about harm to people; a caution about harm to equipment. Shown in this order.</p>
        <ol className="flex flex-col gap-4">
          {cautions.fields.map((field, i) => {
            const label = `item ${i + 1}`;
            return (
              <li key={field.fieldKey} className="flex flex-col gap-3 border-b-2 border-line-soft pb-4 last:border-b-0 last:pb-0">
                <p className="font-bold">Item {i + 1}</p>
                <SelectField
                  label={`Kind of ${label}`}
                  options={[
                    { value: 'warning', label: 'Warning: can harm people' },
                    { value: 'caution', label: 'Caution: can harm equipment' },
                  ]}
                  error={e.cautions?.[i]?.severity?.message}
                  {...register(`cautions.${i}.severity`)}
                />
                <TextAreaField label={`Text of ${label}`} rows={3} error={e.cautions?.[i]?.text?.message} {...register(`cautions.${i}.text`)} />
                <TextField label={`Source of ${label}`} hint={SOURCE_HINT} error={e.cautions?.[i]?.source?.message} {...register(`cautions.${i}.source`)} />
                <div className="flex flex-wrap gap-2">
                  <Button aria-label={`Move ${label} up`} disabled={i === 0} onClick={() => cautions.move(i, i - 1)}>
                    Up
                  </Button>
                  <Button aria-label={`Move ${label} down`} disabled={i === cautions.fields.length - 1} onClick={() => cautions.move(i, i + 1)}>
                    Down
                  </Button>
                  <Button variant="danger" aria-label={`Remove ${label}`} onClick={() => cautions.remove(i)}>
                    Remove
                  </Button>
                </div>
              </li>
            );
          })}
        </ol>
        <FieldError id="cautions-root-error" message={e.cautions?.root?.message ?? e.cautions?.message} />
        <Button
          className="mt-3"
          disabled={cautions.fields.length >= 30}
          onClick={() => cautions.append({ key: freshKey(getValues('cautions')), severity: 'warning', text: '', source: '' })}
        >
          Add a warning or caution
        </Button>
      </fieldset>

      <fieldset className="min-w-0 rounded-md border-2 border-line-soft p-3">
        <legend className="px-1 text-lg font-bold">Personal protective equipment</legend>
        <ol className="flex flex-col gap-4">
          {ppe.fields.map((field, i) => {
            const label = `PPE item ${i + 1}`;
            return (
              <li key={field.fieldKey} className="flex flex-col gap-3 border-b-2 border-line-soft pb-4 last:border-b-0 last:pb-0">
                <p className="font-bold">PPE item {i + 1}</p>
                <TextField label={`What to wear, ${label}`} error={e.ppe?.[i]?.text?.message} {...register(`ppe.${i}.text`)} />
                <TextField label={`Source of ${label}`} hint={SOURCE_HINT} error={e.ppe?.[i]?.source?.message} {...register(`ppe.${i}.source`)} />
                <div className="flex flex-wrap gap-2">
                  <Button aria-label={`Move ${label} up`} disabled={i === 0} onClick={() => ppe.move(i, i - 1)}>
                    Up
                  </Button>
                  <Button aria-label={`Move ${label} down`} disabled={i === ppe.fields.length - 1} onClick={() => ppe.move(i, i + 1)}>
                    Down
                  </Button>
                  <Button variant="danger" aria-label={`Remove ${label}`} onClick={() => ppe.remove(i)}>
                    Remove
                  </Button>
                </div>
              </li>
            );
          })}
        </ol>
        {ppe.fields.length === 0 ? <p className="text-ink-muted">No PPE listed.</p> : null}
        <FieldError id="ppe-root-error" message={e.ppe?.root?.message ?? e.ppe?.message} />
        <Button className="mt-3" disabled={ppe.fields.length >= 30} onClick={() => ppe.append({ text: '', source: '' })}>
          Add a PPE item
        </Button>
      </fieldset>

      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Saving…">
          Save cautions and PPE
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}
