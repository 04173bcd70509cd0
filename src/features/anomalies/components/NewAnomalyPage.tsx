import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Page } from '../../../components/ui/Page';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';
import type { AnomalyCreateInput } from '../../../contract/anomalies';
import { applyServerError } from '../../../lib/forms';
import { useSignedInMe } from '../../../lib/session';
import { useCreateAnomaly } from '../api/createAnomaly';
import { useCountChoices } from '../api/listCountChoices';
import { useSeverityScale } from '../api/listSeverities';
import { canReport, instantInputValue, parseInstantInput } from '../lib/format';

const NO_COUNT = '';

/** The form's own shape: selects and inputs give strings; sent through the contract's schema on the server. */
export const anomalyFormSchema = z
  .object({
    title: z.string().trim().min(1, 'Enter a title').max(200, 'Use at most 200 characters'),
    description: z.string().trim().min(1, 'Say what happened').max(4000, 'Use at most 4000 characters'),
    severity: z.string().min(1, 'Choose a severity'),
    immediateActions: z.string().trim().max(4000, 'Use at most 4000 characters'),
    countId: z.string(),
    at: z.string(),
  })
  .superRefine((v, ctx) => {
    if (v.at !== '' && parseInstantInput(v.at) === undefined) ctx.addIssue({ code: 'custom', path: ['at'], message: 'Give a date and time' });
    if (v.countId !== NO_COUNT && v.at === '') ctx.addIssue({ code: 'custom', path: ['at'], message: 'Give the instant of the count it happened at' });
  });
export type AnomalyFormValues = z.input<typeof anomalyFormSchema>;
const FIELDS = ['title', 'description', 'severity', 'immediateActions', 'countId', 'at'] as const;

/** Form values -> the create body. A prefilled instant keeps its milliseconds unless the field was changed. */
export function formToAnomalyInput(v: AnomalyFormValues, exactAt: number | null): AnomalyCreateInput {
  const typed = v.at === '' ? undefined : parseInstantInput(v.at);
  const sameSecond = exactAt !== null && typed !== undefined && Math.floor(typed / 1000) === Math.floor(exactAt / 1000);
  const at = sameSecond ? exactAt : typed;
  const severity = /^\d+$/.test(v.severity) ? Number(v.severity) : v.severity;
  return {
    title: v.title.trim(),
    description: v.description.trim(),
    severity,
    immediateActions: v.immediateActions.trim(),
    countId: v.countId === NO_COUNT ? null : Number(v.countId),
    ...(at !== undefined ? { at } : {}),
  };
}

export function NewAnomalyPage() {
  const me = useSignedInMe();
  const [params] = useSearchParams();
  if (!canReport(me.roles)) {
    return (
      <Page title="You cannot report anomalies" kicker="403 · Not allowed">
        <Notice tone="warning" title="This page needs another role">
          <p>A test conductor, safety officer, administrator or station operator reports anomalies. Everyone signed in can read them.</p>
        </Notice>
        <p className="mt-4">
          <Link to="/anomalies">Back to the anomalies</Link>
        </p>
      </Page>
    );
  }
  const countParam = params.get('countId');
  const atParam = Number(params.get('at'));
  const exactAt = params.get('at') !== null && Number.isSafeInteger(atParam) && atParam > 0 ? atParam : null;
  return (
    <Page title="Report an anomaly" kicker="Anomalies" narrow>
      <p className="mb-4">
        <Link to="/anomalies">Back to the anomalies</Link>
      </p>
      <AnomalyForm countId={countParam && /^\d+$/.test(countParam) ? countParam : NO_COUNT} exactAt={exactAt} />
    </Page>
  );
}

export function AnomalyForm({ countId, exactAt }: { countId: string; exactAt: number | null }) {
  const create = useCreateAnomaly();
  const navigate = useNavigate();
  const counts = useCountChoices();
  const scale = useSeverityScale();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<AnomalyFormValues>({
    resolver: zodResolver(anomalyFormSchema),
    defaultValues: { title: '', description: '', severity: '', immediateActions: '', countId, at: exactAt !== null ? instantInputValue(exactAt) : '' },
  });
  const { register, handleSubmit, watch, setError, formState } = form;
  const e = formState.errors;
  const chosenCount = watch('countId');
  const countOptions = (counts.data ?? []).map((c) => ({ value: String(c.id), label: c.name }));
  if (countId !== NO_COUNT && !countOptions.some((o) => o.value === countId)) countOptions.unshift({ value: countId, label: `Count ${countId}` });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const saved = await create.mutateAsync(formToAnomalyInput(values, exactAt));
      await navigate(`/anomalies/${saved.id}`);
    } catch (error) {
      setFormError(applyServerError(error, setError, FIELDS));
    }
  });

  return (
    <Form onSubmit={(event) => void submit(event)} aria-label="Report an anomaly">
      <FormError title="Not reported" message={formError} />
      <TextField label="Title" hint="A short name, e.g. “Fuel inlet pressure spike at pre-valve opening”." autoComplete="off" error={e.title?.message} {...register('title')} />
      <TextAreaField label="What happened" hint="What was seen or measured, where, and what the count or crew was doing." error={e.description?.message} {...register('description')} />
      <SelectField
        label="Severity"
        hint={scale.data ? `The severity categories of ${scale.data.matrixName}, the team's default risk matrix.` : 'Loading the severity categories…'}
        placeholder="Choose…"
        options={(scale.data?.severities ?? []).map((s) => ({ value: s.key, label: `${s.key} ${s.label}` }))}
        error={e.severity?.message}
        {...register('severity')}
      />
      <TextAreaField label="Immediate actions taken" hint="What was done at once: a hold, safing, venting, keeping people out." error={e.immediateActions?.message} {...register('immediateActions')} />
      <SelectField
        label="Count"
        hint="The count it happened in, or none for one found outside a count (a walk-down, an inspection)."
        placeholder="No count (found outside a count)"
        options={countOptions}
        error={e.countId?.message}
        {...register('countId')}
      />
      <TextField
        label={chosenCount === NO_COUNT ? 'When it was found (optional)' : 'Instant of the count'}
        hint={
          chosenCount === NO_COUNT
            ? 'Your local time. Left empty, the time of this report is used.'
            : 'Your local time, to the second. Holdfire works out the count time (T) at this instant from the count log.'
        }
        type="datetime-local"
        step={1}
        error={e.at?.message}
        {...register('at')}
      />
      <p className="text-sm text-ink-muted">Photos and files are added on the anomaly's page once it is reported.</p>
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Reporting…">
          Report anomaly
        </Button>
      </FormActions>
    </Form>
  );
}
