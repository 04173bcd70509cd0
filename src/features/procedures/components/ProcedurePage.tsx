import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button, buttonClasses } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { TextAreaField } from '../../../components/ui/SelectField';
import { Time } from '../../../components/ui/Time';
import type { ProcedureDto, RevisionSummaryDto } from '../../../contract/procedures';
import { errorMessage, isApiError } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useSignedInMe } from '../../../lib/session';
import { useDiscardDraft } from '../api/discardDraft';
import { useProcedure } from '../api/getProcedure';
import { useProcedureAnomalies } from '../api/listProcedureAnomalies';
import { useStations } from '../api/listStations';
import { useOpenDraft } from '../api/openDraft';
import { procedureUpdateInputSchema, useUpdateProcedure, type ProcedureUpdateInput } from '../api/updateProcedure';
import { canEditStations, canWriteProcedures, idParam, SIGNOFF_LABELS } from '../lib/format';
import { ProceduresNav } from './ProceduresNav';
import { RevisionAnomalies } from './RevisionAnomalies';
import { RevisionBadge } from './RevisionBadge';

export function ProcedureMissing({ message = 'There is no procedure at this address.' }: { message?: string }) {
  return (
    <Page title="Procedure not found" kicker="Procedures">
      <Notice tone="warning" title="Not found">
        <p>{message}</p>
      </Notice>
      <p className="mt-4">
        <Link to="/procedures">Back to the procedures</Link>
      </p>
    </Page>
  );
}

export function ProcedureLoadError({ error, retry }: { error: unknown; retry: () => void }) {
  if (isApiError(error) && error.status === 404) return <ProcedureMissing message={error.message} />;
  return (
    <Page title="Procedure" kicker="Procedures">
      <Notice tone="danger" title="Could not load this procedure">
        <p>{errorMessage(error)}</p>
        <Button className="mt-2" onClick={retry}>
          Try again
        </Button>
      </Notice>
    </Page>
  );
}

export function ProcedurePage() {
  const id = idParam(useParams().id);
  if (id === null) return <ProcedureMissing />;
  return <ProcedureDetail id={id} />;
}

function ProcedureDetail({ id }: { id: number }) {
  const me = useSignedInMe();
  const canWrite = canWriteProcedures(me.roles);
  const procedure = useProcedure(id);
  const [editing, setEditing] = useState(false);

  if (procedure.isPending) return <Loading label="Loading procedure…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  const p = procedure.data;
  const revisions = p.revisions;

  return (
    <Page title={p.name} kicker="Procedure">
      <ProceduresNav />
      <p className="mb-4">
        <Link to="/procedures">Back to the procedures</Link>
      </p>
      <div className="flex flex-col gap-6">
        <Section title={editing ? 'Edit details' : 'Details'}>
          {editing ? (
            <ProcedureDetailsForm procedure={p} onDone={() => setEditing(false)} />
          ) : (
            <>
              <ProcedureFacts procedure={p} />
              {canWrite ? (
                <Button className="mt-4" onClick={() => setEditing(true)}>
                  Edit details
                </Button>
              ) : null}
            </>
          )}
        </Section>
        <Section title="Revisions">
          <RevisionsPanel procedure={p} canWrite={canWrite} />
        </Section>
        <Section title="Crew">
          <p className="mb-3 max-w-prose">Who stands at which station for this procedure, and whether every station it needs is manned.</p>
          <Link to={`/procedures/${p.id}/crew`} className={buttonClasses('secondary')}>
            {canEditStations(me.roles) ? 'Plan the crew' : 'See the crew plans'}
          </Link>
        </Section>
        {revisions.length >= 2 ? (
          <Section title="Compare revisions">
            <p className="mb-3 max-w-prose">See which steps were added, removed, changed or moved between any two revisions.</p>
            <Link
              to={`/procedures/${p.id}/diff?from=${revisions[revisions.length - 2]!.number}&to=${revisions[revisions.length - 1]!.number}`}
              className={buttonClasses('secondary')}
            >
              Compare revisions {revisions[revisions.length - 2]!.number} and {revisions[revisions.length - 1]!.number}
            </Link>
          </Section>
        ) : null}
      </div>
    </Page>
  );
}

export function ProcedureFacts({ procedure: p }: { procedure: Pick<ProcedureDto, 'purpose' | 'testArticle' | 'site' | 'stations'> }) {
  const rows = [
    { label: 'Purpose', value: p.purpose || '—' },
    { label: 'Test article', value: p.testArticle || '—' },
    { label: 'Site', value: p.site || '—' },
    { label: 'Stations listed besides the steps’ own', value: p.stations.length ? p.stations.join(', ') : 'None' },
  ];
  return (
    <dl className="grid gap-x-4 gap-y-2 sm:grid-cols-[max-content_minmax(0,1fr)]">
      {rows.map((r) => (
        <div key={r.label} className="contents">
          <dt className="font-bold">{r.label}</dt>
          <dd className="min-w-0 max-w-prose break-words">{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}

const DETAIL_FIELDS = ['name', 'purpose', 'testArticle', 'site', 'stations'] as const;

function ProcedureDetailsForm({ procedure: p, onDone }: { procedure: ProcedureDto; onDone: () => void }) {
  const update = useUpdateProcedure();
  const stations = useStations();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<ProcedureUpdateInput>({
    resolver: zodResolver(procedureUpdateInputSchema) as never,
    defaultValues: { name: p.name, purpose: p.purpose, testArticle: p.testArticle, site: p.site, stations: p.stations },
  });
  const { register, control, handleSubmit, setError, formState } = form;
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await update.mutateAsync({ id: p.id, input: values });
      onDone();
    } catch (error) {
      setFormError(applyServerError(error, setError, DETAIL_FIELDS));
    }
  });
  return (
    <Form onSubmit={(event) => void submit(event)} aria-label="Edit procedure details">
      <FormError title="Not saved" message={formError} />
      <TextField label="Name" error={e.name?.message} {...register('name')} />
      <TextAreaField label="Purpose" error={e.purpose?.message} {...register('purpose')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Test article" error={e.testArticle?.message} {...register('testArticle')} />
        <TextField label="Site" error={e.site?.message} {...register('site')} />
      </div>
      <Controller
        control={control}
        name="stations"
        render={({ field, fieldState }) => (
          <CheckboxGroup
            legend="Stations involved besides those the steps name"
            layout="wrap"
            options={(stations.data ?? []).map((s) => ({ value: s.code, label: `${s.code} ${s.name}` }))}
            value={field.value ?? []}
            onChange={field.onChange}
            error={fieldState.error?.message}
          />
        )}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Saving…">
          Save details
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

function SignoffSummary({ revision: r }: { revision: RevisionSummaryDto }) {
  if (r.signoffs.length === 0) return <span className="text-ink-muted">None yet</span>;
  return (
    <ul className="flex flex-col gap-0.5">
      {r.signoffs.map((s) => (
        <li key={s.role}>
          {s.userName} <span className="text-ink-muted">as {SIGNOFF_LABELS[s.role].toLowerCase()}</span>, <Time value={s.at} />
        </li>
      ))}
    </ul>
  );
}

function RevisionsPanel({ procedure: p, canWrite }: { procedure: ProcedureDto; canWrite: boolean }) {
  const open = useOpenDraft();
  const discard = useDiscardDraft();
  const navigate = useNavigate();
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const draft = p.revisions.find((r) => r.status === 'draft');
  const latestReleased = p.latestReleased?.number ?? null;
  const newest = [...p.revisions].reverse();
  const anomalies = useProcedureAnomalies(p.id);

  return (
    <div className="flex flex-col gap-4">
      <ul className="flex flex-col gap-3" aria-label="Revisions, newest first">
        {newest.map((r) => (
          <li key={r.id} className="rounded-md border-2 border-line p-3">
            <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
              <h3 className="text-xl font-bold">Revision {r.number}</h3>
              <RevisionBadge status={r.status} />
              {r.number === latestReleased ? <span className="text-sm font-bold">The one a count runs from</span> : null}
              {r.status === 'released' && latestReleased !== null && r.number < latestReleased ? (
                <span className="text-sm text-ink-muted">Replaced by revision {latestReleased}</span>
              ) : null}
            </div>
            <RevisionAnomalies anomalies={anomalies.data ?? []} procedureId={p.id} revisionNumber={r.number} />
            <div className="mt-2 grid gap-2 sm:grid-cols-[max-content_minmax(0,1fr)] sm:gap-x-4">
              <span className="font-bold">Sign-offs</span>
              <SignoffSummary revision={r} />
              {r.releasedAt ? (
                <>
                  <span className="font-bold">Released</span>
                  <Time value={r.releasedAt} />
                </>
              ) : null}
            </div>
            <div className="mt-3 flex flex-wrap gap-2">
              <Link to={`/procedures/${p.id}/revisions/${r.number}`} className={buttonClasses(r.status === 'draft' ? 'secondary' : 'primary')}>
                View revision {r.number}
              </Link>
              {r.status === 'draft' && canWrite ? (
                <Link to={`/procedures/${p.id}/revisions/${r.number}/edit`} className={buttonClasses('primary')}>
                  Edit draft
                </Link>
              ) : null}
              <Link to={`/procedures/${p.id}/revisions/${r.number}/print`} className={buttonClasses('quiet')}>
                Printable copy
              </Link>
            </div>
          </li>
        ))}
      </ul>
      {canWrite && !draft ? (
        <div className="flex flex-col gap-2">
          <p className="max-w-prose">A new draft starts as a copy of revision {p.revisions[p.revisions.length - 1]?.number}. The released revisions stay as they are.</p>
          <div>
            <Button
              variant="primary"
              pending={open.isPending}
              pendingLabel="Opening…"
              onClick={() =>
                open.mutate(p.id, { onSuccess: (rev) => navigate(`/procedures/${p.id}/revisions/${rev.number}/edit`) })
              }
            >
              Open a new draft
            </Button>
          </div>
          {open.isError ? (
            <Notice tone="danger" title="No draft opened">
              <p>{errorMessage(open.error)}</p>
            </Notice>
          ) : null}
        </div>
      ) : null}
      {canWrite && draft && p.revisions.length > 1 ? (
        <div className="flex flex-col gap-2">
          {confirmDiscard ? (
            <Notice tone="warning" title={`Discard draft revision ${draft.number}?`}>
              <p>Its steps and any sign-offs are deleted. The released revisions are not touched.</p>
              <div className="mt-2 flex flex-wrap gap-2">
                <Button
                  variant="danger"
                  pending={discard.isPending}
                  pendingLabel="Discarding…"
                  onClick={() => discard.mutate({ procedureId: p.id, rev: draft.number }, { onSuccess: () => setConfirmDiscard(false) })}
                >
                  Discard revision {draft.number}
                </Button>
                <Button variant="quiet" onClick={() => setConfirmDiscard(false)}>
                  Keep it
                </Button>
              </div>
            </Notice>
          ) : (
            <div>
              <Button variant="quiet" onClick={() => setConfirmDiscard(true)}>
                Discard draft revision {draft.number}
              </Button>
            </div>
          )}
          {discard.isError ? (
            <Notice tone="danger" title="Not discarded">
              <p>{errorMessage(discard.error)}</p>
            </Notice>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
