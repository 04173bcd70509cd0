import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { CalcName, EvidenceInput, HazardDto } from '../../../contract/hazards';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { byPrecedence, MITIGATION_KIND_INFO } from '../../../domain/hazards/mitigation';
import { errorMessage, isApiError } from '../../../lib/api';
import { useAttachCalcEvidence } from '../api/attachCalcEvidence';
import { useHazards } from '../api/listHazards';
import { CALC_TITLES } from '../lib/calcEvidence';
import { SelectField } from '../../../components/ui/SelectField';

interface Values {
  hazardId: string;
  mitigationId: string;
  label: string;
}

interface Attached {
  hazard: HazardDto;
  mitigation: string;
}

const cut = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

function AttachForm({ calc, inputs, onCancel }: { calc: CalcName; inputs: Record<string, string | number>; onCancel: () => void }) {
  const hazards = useHazards();
  const attach = useAttachCalcEvidence();
  const form = useForm<Values>({ defaultValues: { hazardId: '', mitigationId: '', label: '' } });
  const [formError, setFormError] = useState<string | null>(null);
  const [attached, setAttached] = useState<Attached | null>(null);
  const e = form.formState.errors;

  if (hazards.isPending) return <Loading label="Loading the hazard register…" />;
  if (hazards.isError) return <FormError title="Could not load the hazards" message={errorMessage(hazards.error)} />;

  // A closed hazard takes no new evidence; reopen it first.
  const open = hazards.data.filter((h) => h.status !== 'closed');
  const hazardId = Number(form.watch('hazardId')) || null;
  const hazard = open.find((h) => h.id === hazardId) ?? null;
  const mitigations = hazard ? byPrecedence(hazard.mitigations) : [];

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    setAttached(null);
    const h = open.find((x) => x.id === Number(values.hazardId));
    const mit = h?.mitigations.find((m) => m.id === Number(values.mitigationId));
    if (!h) return form.setError('hazardId', { message: 'Choose the hazard to attach the result to.' });
    if (!mit) return form.setError('mitigationId', { message: 'Choose one of its mitigations.' });
    try {
      const input = { mitigationId: mit.id, calc, inputs, label: values.label.trim() || CALC_TITLES[calc] } as EvidenceInput;
      const saved = await attach.mutateAsync({ hazardId: h.id, input });
      setAttached({ hazard: saved, mitigation: mit.description });
      form.reset({ hazardId: '', mitigationId: '', label: '' });
    } catch (error) {
      setFormError(isApiError(error) && error.details.length ? `${error.message} ${error.details.map((d) => d.message).join(' ')}` : errorMessage(error));
    }
  });

  return (
    <div className="flex flex-col gap-3">
      {attached ? (
        <Notice tone="success" title="Result attached">
          <p>
            Frozen as evidence on{' '}
            <Link to={`/hazards/${attached.hazard.id}`}>
              {attached.hazard.code} {attached.hazard.title}
            </Link>
            , mitigation “{cut(attached.mitigation, 80)}”. The inputs, results and date are kept as they are now.
          </p>
        </Notice>
      ) : null}
      <Form onSubmit={(ev) => void submit(ev)} aria-label={`Attach the ${CALC_TITLES[calc].toLowerCase()} result to a hazard`} className="rounded-md border-2 border-line-soft p-3">
        <FormError title="Result not attached" message={formError} />
        <SelectField
          label="Hazard"
          placeholder="Choose a hazard"
          options={open.map((h) => ({ value: String(h.id), label: `${h.code} ${cut(h.title, 70)}` }))}
          error={e.hazardId?.message}
          {...form.register('hazardId', { onChange: () => form.setValue('mitigationId', '') })}
        />
        {hazard && mitigations.length === 0 ? (
          <Notice tone="info" title="No mitigations yet">
            <p>
              Evidence belongs to a mitigation. <Link to={`/hazards/${hazard.id}`}>Add a mitigation to {hazard.code}</Link> first.
            </p>
          </Notice>
        ) : (
          <SelectField
            label="Mitigation"
            placeholder={hazard ? 'Choose a mitigation' : 'Choose a hazard first'}
            disabled={!hazard}
            options={mitigations.map((m) => ({ value: String(m.id), label: `${MITIGATION_KIND_INFO[m.kind].precedence}. ${cut(m.description, 70)}` }))}
            error={e.mitigationId?.message}
            {...form.register('mitigationId')}
          />
        )}
        <TextField label="Label (optional)" hint={`Without a label it is called “${CALC_TITLES[calc]}”.`} maxLength={200} autoComplete="off" {...form.register('label')} />
        <FormActions>
          <Button type="submit" variant="primary" pending={attach.isPending} pendingLabel="Attaching…">
            Attach result
          </Button>
          <Button variant="quiet" onClick={onCancel}>
            Close
          </Button>
        </FormActions>
      </Form>
    </div>
  );
}

/**
 * For safety officers and admins under a result: freeze it on a hazard's mitigation. The server runs the
 * calculator again with the same inputs, so what is frozen is the server's answer, not the page's.
 */
export function AttachCalcResult({ calc, inputs }: { calc: CalcName; inputs: Record<string, string | number> }) {
  const [open, setOpen] = useState(false);
  if (!open) {
    return (
      <div className="hf-no-print">
        <Button onClick={() => setOpen(true)}>Attach this result to a hazard</Button>
      </div>
    );
  }
  return <AttachForm calc={calc} inputs={inputs} onCancel={() => setOpen(false)} />;
}
