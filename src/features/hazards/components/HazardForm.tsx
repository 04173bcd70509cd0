import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { HAZARD_PHASES, HAZARD_SYSTEMS, type HazardCreateInput, type HazardDto } from '../../../contract/hazards';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { applyServerError } from '../../../lib/forms';
import { PHASE_LABELS, PROPELLANT_OPTIONS, SYSTEM_LABELS } from '../lib/labels';
import { levelFor, MATRIX } from '../lib/risk';
import { ListEditor } from './ListEditor';
import { RiskBadge } from './RiskBadge';
import { SelectField, TextAreaField } from './SelectField';

const list = (what: string) => z.array(z.string().trim().max(500, 'Use at most 500 characters')).max(20, `List at most 20 ${what}`);

/** The form's own shape: selects give strings, '' means "not chosen". Sent through the contract's schema. */
export const hazardFormSchema = z
  .object({
    title: z.string().trim().min(1, 'Enter a title').max(200, 'Use at most 200 characters'),
    system: z.enum(HAZARD_SYSTEMS, 'Choose a system'),
    phase: z.enum(HAZARD_PHASES, 'Choose a phase'),
    description: z.string().trim().max(4000, 'Use at most 4000 characters'),
    causes: list('causes'),
    effects: list('effects'),
    energies: list('energy sources'),
    propellants: z.array(z.string()),
    initialSeverity: z.string().min(1, 'Choose the initial severity'),
    initialLikelihood: z.string().min(1, 'Choose the initial likelihood'),
    residualSeverity: z.string(),
    residualLikelihood: z.string(),
  })
  .superRefine((v, ctx) => {
    if ((v.residualSeverity === '') !== (v.residualLikelihood === '')) {
      const path = v.residualSeverity === '' ? 'residualSeverity' : 'residualLikelihood';
      ctx.addIssue({ code: 'custom', path: [path], message: 'Give both residual severity and likelihood, or neither' });
    }
  });
export type HazardFormValues = z.input<typeof hazardFormSchema>;

const FIELDS = [
  'title',
  'system',
  'phase',
  'description',
  'causes',
  'effects',
  'energies',
  'propellants',
  'initialSeverity',
  'initialLikelihood',
  'residualSeverity',
  'residualLikelihood',
] as const;

export function hazardToForm(h?: HazardDto): HazardFormValues {
  return {
    title: h?.title ?? '',
    system: (h?.system ?? '') as HazardFormValues['system'],
    phase: (h?.phase ?? '') as HazardFormValues['phase'],
    description: h?.description ?? '',
    causes: h?.causes ?? [],
    effects: h?.effects ?? [],
    energies: h?.energies ?? [],
    propellants: h?.propellants ?? [],
    initialSeverity: h ? String(h.initialSeverity) : '',
    initialLikelihood: h?.initialLikelihood ?? '',
    residualSeverity: h?.residualSeverity == null ? '' : String(h.residualSeverity),
    residualLikelihood: h?.residualLikelihood ?? '',
  };
}

/** Form values -> the contract's create/update body. The built-in matrix sends severities as numbers. */
export function formToInput(v: HazardFormValues): HazardCreateInput {
  const sev = (s: string) => (/^\d+$/.test(s) ? Number(s) : s);
  const clean = (items: readonly string[]) => items.map((s) => s.trim()).filter(Boolean);
  return {
    title: v.title.trim(),
    system: v.system,
    phase: v.phase,
    description: v.description.trim(),
    causes: clean(v.causes),
    effects: clean(v.effects),
    energies: clean(v.energies),
    propellants: v.propellants as HazardCreateInput['propellants'],
    initialSeverity: sev(v.initialSeverity),
    initialLikelihood: v.initialLikelihood,
    residualSeverity: v.residualSeverity === '' ? null : sev(v.residualSeverity),
    residualLikelihood: v.residualLikelihood === '' ? null : v.residualLikelihood,
  };
}

const severityOptions = MATRIX.severities.map((s) => ({ value: s.key, label: `${s.key} ${s.label}` }));
const likelihoodOptions = MATRIX.likelihoods.map((l) => ({ value: l.key, label: `${l.key} ${l.label}` }));

function LiveRisk({ label, severity, likelihood }: { label: string; severity: string; likelihood: string }) {
  return (
    <p className="flex flex-wrap items-center gap-2" aria-live="polite">
      <span className="font-bold">{label}:</span>
      <RiskBadge level={levelFor(severity, likelihood)} />
    </p>
  );
}

export function HazardForm({
  initial,
  submitLabel,
  pendingLabel,
  onSubmit,
  onCancel,
}: {
  initial?: HazardDto;
  submitLabel: string;
  pendingLabel: string;
  /** Resolves on success; a rejection's ApiError is placed at the fields it names. */
  onSubmit: (input: HazardCreateInput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const form = useForm<HazardFormValues>({ resolver: zodResolver(hazardFormSchema), defaultValues: hazardToForm(initial) });
  const { register, control, handleSubmit, watch, setError, formState } = form;
  const [formError, setFormError] = useState<string | null>(null);
  const [iS, iL, rS, rL] = watch(['initialSeverity', 'initialLikelihood', 'residualSeverity', 'residualLikelihood']);
  const e = formState.errors;

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(formToInput(values));
    } catch (error) {
      setFormError(applyServerError(error, setError, FIELDS));
    }
  });

  return (
    <Form onSubmit={(event) => void submit(event)} aria-label={submitLabel}>
      <FormError title="Not saved" message={formError} />
      <TextField label="Title" error={e.title?.message} {...register('title')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="System" placeholder="Choose…" options={HAZARD_SYSTEMS.map((s) => ({ value: s, label: SYSTEM_LABELS[s] }))} error={e.system?.message} {...register('system')} />
        <SelectField label="Phase" placeholder="Choose…" options={HAZARD_PHASES.map((p) => ({ value: p, label: PHASE_LABELS[p] }))} error={e.phase?.message} {...register('phase')} />
      </div>
      <TextAreaField label="Description" error={e.description?.message} {...register('description')} />
      <Controller
        control={control}
        name="causes"
        render={({ field, fieldState }) => <ListEditor legend="Causes" itemLabel="Cause" value={field.value} onChange={field.onChange} error={fieldState.error?.message ?? firstItemError(fieldState)} />}
      />
      <Controller
        control={control}
        name="effects"
        render={({ field, fieldState }) => <ListEditor legend="Effects" itemLabel="Effect" value={field.value} onChange={field.onChange} error={fieldState.error?.message ?? firstItemError(fieldState)} />}
      />
      <Controller
        control={control}
        name="energies"
        render={({ field, fieldState }) => (
          <ListEditor
            legend="Energy sources"
            itemLabel="Energy source"
            hint="For example: stored pressure 6 MPa GN2, cryogenic liquid, chemical (LOX/ethanol)."
            value={field.value}
            onChange={field.onChange}
            error={fieldState.error?.message ?? firstItemError(fieldState)}
          />
        )}
      />
      <Controller
        control={control}
        name="propellants"
        render={({ field, fieldState }) => (
          <CheckboxGroup legend="Propellants and pressurants involved" layout="wrap" options={PROPELLANT_OPTIONS} value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
        )}
      />
      <fieldset className="grid gap-4 rounded-md border-2 border-line-soft p-3 sm:grid-cols-2">
        <legend className="px-1 font-bold">Initial risk (before mitigation)</legend>
        <SelectField label="Initial severity" placeholder="Choose…" options={severityOptions} error={e.initialSeverity?.message} {...register('initialSeverity')} />
        <SelectField label="Initial likelihood" placeholder="Choose…" options={likelihoodOptions} error={e.initialLikelihood?.message} {...register('initialLikelihood')} />
        <div className="sm:col-span-2">
          <LiveRisk label="Initial risk level" severity={iS} likelihood={iL} />
        </div>
      </fieldset>
      <fieldset className="grid gap-4 rounded-md border-2 border-line-soft p-3 sm:grid-cols-2">
        <legend className="px-1 font-bold">Residual risk (after mitigation)</legend>
        <SelectField label="Residual severity" placeholder="Not assessed yet" options={severityOptions} error={e.residualSeverity?.message} {...register('residualSeverity')} />
        <SelectField
          label="Residual likelihood"
          placeholder="Not assessed yet"
          hint="Only a design change or engineered feature can make a hazard Eliminated (F)."
          options={likelihoodOptions}
          error={e.residualLikelihood?.message}
          {...register('residualLikelihood')}
        />
        <div className="sm:col-span-2">
          <LiveRisk label="Residual risk level" severity={rS} likelihood={rL} />
        </div>
      </fieldset>
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel={pendingLabel}>
          {submitLabel}
        </Button>
        {onCancel ? (
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </FormActions>
    </Form>
  );
}

// Errors on one line of a list come back as an array of per-item errors.
function firstItemError(state: { error?: unknown }): string | undefined {
  const err = state.error as unknown;
  if (Array.isArray(err)) {
    const i = err.findIndex((x) => x && typeof x === 'object' && 'message' in x);
    if (i >= 0) return `Line ${i + 1}: ${(err[i] as { message: string }).message}`;
  }
  return undefined;
}
