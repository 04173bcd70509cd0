import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { mitigationInputSchema, VERIFICATION_STATUSES, type HazardDto, type MitigationDto, type MitigationInput } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { byPrecedence, MITIGATION_KIND_INFO, MITIGATION_KINDS } from '../../../domain/hazards/mitigation';
import { errorMessage } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useAddMitigation } from '../api/addMitigation';
import { useRemoveMitigation } from '../api/removeMitigation';
import { useUpdateMitigation } from '../api/updateMitigation';
import { VERIFICATION_LABELS } from '../lib/labels';
import { EvidencePanel } from './EvidencePanel';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';

const kindOptions = MITIGATION_KINDS.map((k) => ({ value: k, label: `${MITIGATION_KIND_INFO[k].precedence}. ${MITIGATION_KIND_INFO[k].label}` }));
const verificationOptions = VERIFICATION_STATUSES.map((v) => ({ value: v, label: VERIFICATION_LABELS[v] }));
const FIELDS = ['kind', 'description', 'owner', 'verificationMethod', 'verificationStatus'] as const;

function VerificationBadge({ status }: { status: MitigationDto['verificationStatus'] }) {
  const tone = status === 'verified' ? 'go' : status === 'failed' ? 'danger' : status === 'in-progress' ? 'caution' : 'neutral';
  const glyph = status === 'verified' ? 'check' : status === 'failed' ? 'cross' : status === 'in-progress' ? 'clock' : 'square';
  return (
    <Badge tone={tone} glyph={glyph}>
      {VERIFICATION_LABELS[status]}
    </Badge>
  );
}

function MitigationForm({
  initial,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  initial?: MitigationDto;
  submitLabel: string;
  onSubmit: (input: MitigationInput) => Promise<unknown>;
  onCancel: () => void;
}) {
  const form = useForm<MitigationInput>({
    resolver: zodResolver(mitigationInputSchema) as never,
    defaultValues: {
      kind: initial?.kind ?? 'engineered-feature',
      description: initial?.description ?? '',
      owner: initial?.owner ?? '',
      verificationMethod: initial?.verificationMethod ?? '',
      verificationStatus: initial?.verificationStatus ?? 'planned',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const e = form.formState.errors;
  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(values);
    } catch (error) {
      setFormError(applyServerError(error, form.setError, FIELDS, { eliminated_without_design_change: 'kind' }));
    }
  });
  return (
    <Form onSubmit={(ev) => void submit(ev)} aria-label={submitLabel} className="rounded-md border-2 border-line-soft p-3">
      <FormError title="Mitigation not saved" message={formError} />
      <SelectField label="Kind (MIL-STD-882E order of precedence)" options={kindOptions} error={e.kind?.message} {...form.register('kind')} />
      <TextAreaField label="What is done" rows={3} error={e.description?.message} {...form.register('description')} />
      <TextField label="Owner" hint="The person who sees it done, by name." error={e.owner?.message} {...form.register('owner')} />
      <TextField label="How it is verified" error={e.verificationMethod?.message} {...form.register('verificationMethod')} />
      <SelectField label="Verification" options={verificationOptions} error={e.verificationStatus?.message} {...form.register('verificationStatus')} />
      <FormActions>
        <Button type="submit" variant="primary" pending={form.formState.isSubmitting} pendingLabel="Saving…">
          {submitLabel}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

export function MitigationsPanel({ hazard, canEdit }: { hazard: HazardDto; canEdit: boolean }) {
  const add = useAddMitigation();
  const update = useUpdateMitigation();
  const remove = useRemoveMitigation();
  const [editing, setEditing] = useState<number | 'new' | null>(null);
  const [removeError, setRemoveError] = useState<string | null>(null);
  const ordered = byPrecedence(hazard.mitigations);

  return (
    <div className="flex flex-col gap-3">
      <p className="text-ink-muted">Listed in MIL-STD-882E order of precedence: design first, procedures and PPE last.</p>
      {removeError ? (
        <Notice tone="danger" title="Mitigation not removed">
          <p>{removeError}</p>
        </Notice>
      ) : null}
      {ordered.length === 0 ? <p>No mitigations recorded yet.</p> : null}
      <ol className="flex flex-col gap-3">
        {ordered.map((m) => (
          <li key={m.id} className="hf-print-avoid-break rounded-md border-2 border-line-soft p-3">
            {editing === m.id ? (
              <MitigationForm
                initial={m}
                submitLabel="Save mitigation"
                onCancel={() => setEditing(null)}
                onSubmit={(input) => update.mutateAsync({ hazardId: hazard.id, id: m.id, input }).then(() => setEditing(null))}
              />
            ) : (
              <>
                <p className="text-sm font-bold uppercase tracking-wide text-ink-muted">
                  {MITIGATION_KIND_INFO[m.kind].precedence}. {MITIGATION_KIND_INFO[m.kind].label}
                </p>
                <p className="mt-1 whitespace-pre-line">{m.description}</p>
                <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
                  <dt className="font-bold">Owner</dt>
                  <dd>{m.owner}</dd>
                  <dt className="font-bold">Verified by</dt>
                  <dd>{m.verificationMethod || <span className="text-ink-muted">Not stated</span>}</dd>
                  <dt className="font-bold">Verification</dt>
                  <dd>
                    <VerificationBadge status={m.verificationStatus} />
                  </dd>
                </dl>
                {canEdit ? (
                  <div className="hf-no-print mt-3 flex flex-wrap gap-2">
                    <Button onClick={() => setEditing(m.id)} aria-label={`Edit mitigation: ${m.description.slice(0, 60)}`}>
                      Edit
                    </Button>
                    <Button
                      variant="danger"
                      aria-label={`Remove mitigation: ${m.description.slice(0, 60)}`}
                      pending={remove.isPending && remove.variables?.id === m.id}
                      pendingLabel="Removing…"
                      onClick={() => {
                        if (!window.confirm('Remove this mitigation? The change is kept in the history.')) return;
                        setRemoveError(null);
                        remove.mutate({ hazardId: hazard.id, id: m.id }, { onError: (err) => setRemoveError(errorMessage(err)) });
                      }}
                    >
                      Remove
                    </Button>
                  </div>
                ) : null}
                <EvidencePanel hazardId={hazard.id} mitigation={m} canEdit={canEdit} />
              </>
            )}
          </li>
        ))}
      </ol>
      {canEdit ? (
        editing === 'new' ? (
          <MitigationForm
            submitLabel="Add mitigation"
            onCancel={() => setEditing(null)}
            onSubmit={(input) => add.mutateAsync({ hazardId: hazard.id, input }).then(() => setEditing(null))}
          />
        ) : (
          <div className="hf-no-print">
            <Button onClick={() => setEditing('new')}>Add a mitigation</Button>
          </div>
        )
      ) : null}
    </div>
  );
}
