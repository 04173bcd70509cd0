import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { BUILT_IN_MATRIX_ID, HAZARD_PHASES, HAZARD_SYSTEMS, type HazardCreateInput, type HazardDto } from '../../../contract/hazards';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { applyServerError } from '../../../lib/forms';
import { PHASE_LABELS, PROPELLANT_OPTIONS, SYSTEM_LABELS } from '../lib/labels';
import { useRiskMatrices } from '../api/listRiskMatrices';
import { levelIn, levelsWorstFirst, matrixCatalogue, type MatrixView } from '../lib/risk';
import { ListEditor } from './ListEditor';
import { RiskBadge } from './RiskBadge';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';

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
    matrixId: z.string().min(1, 'Choose a risk matrix'),
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
  'matrixId',
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
    matrixId: h?.matrixId ?? BUILT_IN_MATRIX_ID,
    initialSeverity: h ? String(h.initialSeverity) : '',
    initialLikelihood: h?.initialLikelihood ?? '',
    residualSeverity: h?.residualSeverity == null ? '' : String(h.residualSeverity),
    residualLikelihood: h?.residualLikelihood ?? '',
  };
}

/**
 * Form values -> the contract's create/update body. The built-in matrix sends severities as numbers. The
 * matrix is sent only for a new hazard: an existing one keeps the matrix it was assessed with.
 */
export function formToInput(v: HazardFormValues, { withMatrix = true }: { withMatrix?: boolean } = {}): HazardCreateInput {
  const builtIn = v.matrixId === BUILT_IN_MATRIX_ID;
  const sev = (s: string) => (builtIn && /^\d+$/.test(s) ? Number(s) : s);
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
    ...(withMatrix ? { matrixId: v.matrixId } : {}),
    initialSeverity: sev(v.initialSeverity),
    initialLikelihood: v.initialLikelihood,
    residualSeverity: v.residualSeverity === '' ? null : sev(v.residualSeverity),
    residualLikelihood: v.residualLikelihood === '' ? null : v.residualLikelihood,
  };
}

const axisOptions = (entries: readonly { key: string; label: string }[]) => entries.map((e) => ({ value: e.key, label: `${e.key} ${e.label}` }));

function LiveRisk({ matrix, label, severity, likelihood }: { matrix: MatrixView | undefined; label: string; severity: string; likelihood: string }) {
  return (
    <p className="flex flex-wrap items-center gap-2" aria-live="polite">
      <span className="font-bold">{label}:</span>
      <RiskBadge level={levelIn(matrix, severity, likelihood)} />
    </p>
  );
}

/** The chosen matrix's levels, worst first, so the preview reads against the whole scale. */
function MatrixLevels({ matrix }: { matrix: MatrixView }) {
  return (
    <div className="text-sm">
      <p className="font-bold">Levels in {matrix.name}, worst first:</p>
      <ul className="mt-1 flex flex-wrap gap-x-3 gap-y-1" aria-label={`Risk levels of ${matrix.name}`}>
        {levelsWorstFirst(matrix).map((level) => (
          <li key={level.key} className="inline-flex items-center gap-1.5">
            <RiskBadge level={level} />
          </li>
        ))}
      </ul>
    </div>
  );
}

export function HazardForm({
  initial,
  prefill,
  submitLabel,
  pendingLabel,
  onSubmit,
  onCancel,
}: {
  initial?: HazardDto;
  /** Starting values for a new hazard (raised from an anomaly); the person checks and completes them. */
  prefill?: Partial<HazardFormValues>;
  submitLabel: string;
  pendingLabel: string;
  /** Resolves on success; a rejection's ApiError is placed at the fields it names. */
  onSubmit: (input: HazardCreateInput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const form = useForm<HazardFormValues>({ resolver: zodResolver(hazardFormSchema), defaultValues: { ...hazardToForm(initial), ...prefill } });
  const { register, control, handleSubmit, watch, setError, setValue, getValues, formState } = form;
  const [formError, setFormError] = useState<string | null>(null);
  const [matrixId, iS, iL, rS, rL] = watch(['matrixId', 'initialSeverity', 'initialLikelihood', 'residualSeverity', 'residualLikelihood']);
  const e = formState.errors;
  const creating = !initial;

  // The team's matrices: a new hazard may use any that is not retired; an existing one keeps its own.
  const matrices = useRiskMatrices();
  const catalogue = matrixCatalogue(matrices.data);
  const matrix = catalogue.get(matrixId);
  const choices = [...catalogue.values()].filter((m) => !m.retired || m.id === matrixId);
  const chose = useRef(false);
  useEffect(() => {
    // Start a new hazard on the team's default matrix once the list arrives, unless one was already chosen.
    if (!creating || chose.current || !matrices.data || prefill?.matrixId) return;
    const preferred = matrices.data.find((m) => m.isDefault && !m.retired);
    if (preferred && preferred.id !== getValues('matrixId')) setValue('matrixId', preferred.id);
  }, [creating, matrices.data, getValues, setValue, prefill?.matrixId]);
  const matrixField = register('matrixId', {
    onChange: () => {
      chose.current = true;
      // Keys mean different things in another matrix: clear the assessment rather than carry it over.
      for (const f of ['initialSeverity', 'initialLikelihood', 'residualSeverity', 'residualLikelihood'] as const) setValue(f, '');
    },
  });
  const severityOptions = axisOptions(matrix?.severities ?? []);
  const likelihoodOptions = axisOptions(matrix?.likelihoods ?? []);

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(formToInput(values, { withMatrix: creating }));
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
      {creating ? (
        <SelectField
          label="Risk matrix"
          hint="The hazard keeps this matrix for all its assessments."
          options={choices.map((m) => ({ value: m.id, label: `${m.name}${m.isDefault ? ' (team default)' : ''}` }))}
          error={e.matrixId?.message}
          {...matrixField}
        />
      ) : (
        <p>
          <span className="font-bold">Risk matrix: </span>
          {matrix?.name ?? matrixId}
          <span className="block text-sm text-ink-muted">A hazard keeps the matrix it was first assessed with.</span>
        </p>
      )}
      {matrix ? <MatrixLevels matrix={matrix} /> : <p className="text-ink-muted">{matrices.isError ? 'Could not load this matrix.' : 'Loading the matrix…'}</p>}
      <fieldset className="grid gap-4 rounded-md border-2 border-line-soft p-3 sm:grid-cols-2">
        <legend className="px-1 font-bold">Initial risk (before mitigation)</legend>
        <SelectField label="Initial severity" placeholder="Choose…" options={severityOptions} error={e.initialSeverity?.message} {...register('initialSeverity')} />
        <SelectField label="Initial likelihood" placeholder="Choose…" options={likelihoodOptions} error={e.initialLikelihood?.message} {...register('initialLikelihood')} />
        <div className="sm:col-span-2">
          <LiveRisk matrix={matrix} label="Initial risk level" severity={iS} likelihood={iL} />
        </div>
      </fieldset>
      <fieldset className="grid gap-4 rounded-md border-2 border-line-soft p-3 sm:grid-cols-2">
        <legend className="px-1 font-bold">Residual risk (after mitigation)</legend>
        <SelectField label="Residual severity" placeholder="Not assessed yet" options={severityOptions} error={e.residualSeverity?.message} {...register('residualSeverity')} />
        <SelectField
          label="Residual likelihood"
          placeholder="Not assessed yet"
          hint={matrixId === BUILT_IN_MATRIX_ID ? 'Only a design change or engineered feature can make a hazard Eliminated (F).' : undefined}
          options={likelihoodOptions}
          error={e.residualLikelihood?.message}
          {...register('residualLikelihood')}
        />
        <div className="sm:col-span-2">
          <LiveRisk matrix={matrix} label="Residual risk level" severity={rS} likelihood={rL} />
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
