import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { SelectField } from '../../../components/ui/SelectField';
import { Time } from '../../../components/ui/Time';
import { countability } from '../../../domain/procedures/release';
import { errorMessage, isApiError } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useCreateCount } from '../api/createCount';
import { useProcedureRevisions } from '../api/getProcedureRevisions';
import { useCountableProcedures } from '../api/listCountableProcedures';
import { useCounts } from '../api/listCounts';
import { STATUS_LOOK } from '../lib/format';
import { SafetyNote } from './CountParts';

function NewCountForm() {
  const navigate = useNavigate();
  const procedures = useCountableProcedures();
  const [procedureId, setProcedureId] = useState<number | null>(null);
  const procedure = useProcedureRevisions(procedureId);
  const [name, setName] = useState('');
  const [windowEnd, setWindowEnd] = useState('');
  const [reportAt, setReportAt] = useState('');
  const [errors, setErrors] = useState<{ procedure?: string; name?: string; windowEnd?: string; reportAt?: string }>({});
  const create = useCreateCount();

  const latest = procedure.data?.latestReleased?.number ?? null;
  const revisions = (procedure.data?.revisions ?? []).map((r) => ({ r, c: countability({ status: r.status, number: r.number, stepCount: 1 }, latest) }));
  const chosen = revisions.find((x) => x.c.countable)?.r ?? null;

  return (
    <Form
      aria-label="New count"
      onSubmit={(e) => {
        e.preventDefault();
        const problems = {
          procedure: procedureId === null ? 'Choose a procedure' : !chosen ? 'This procedure has no released revision to count from' : undefined,
          name: name.trim() ? undefined : 'Enter a name',
          windowEnd: windowEnd && Number.isNaN(Date.parse(windowEnd)) ? 'Use a date and time' : undefined,
          reportAt: reportAt && Number.isNaN(Date.parse(reportAt)) ? 'Use a date and time' : undefined,
        };
        setErrors(problems);
        if (problems.procedure || problems.name || problems.windowEnd || problems.reportAt || procedureId === null || !chosen) return;
        create.mutate(
          { procedureId, revisionId: chosen.id, name: name.trim(), ...(windowEnd ? { windowEnd: new Date(windowEnd).toISOString() } : {}), ...(reportAt ? { reportAt: new Date(reportAt).toISOString() } : {}) },
          { onSuccess: (count) => void navigate(`/counts/${count.id}`) },
        );
      }}
    >
      {procedures.isPending ? <Loading label="Loading procedures…" /> : null}
      <SelectField
        label="Procedure"
        value={procedureId === null ? '' : String(procedureId)}
        placeholder="Choose a procedure…"
        options={(procedures.data ?? []).map((p) => ({ value: String(p.id), label: `${p.name}${p.latestReleased ? ` (released rev. ${p.latestReleased.number})` : ' (no released revision)'}` }))}
        onChange={(e) => setProcedureId(e.target.value ? Number(e.target.value) : null)}
        error={errors.procedure}
      />
      {procedureId !== null && procedure.data ? (
        <div>
          <p className="font-bold">Revisions</p>
          <ul className="flex flex-col gap-1">
            {revisions.map(({ r, c }) => (
              <li key={r.id} className="flex flex-wrap items-center gap-2">
                {c.countable ? <Badge tone="go" glyph="check">Rev. {r.number}: will be counted</Badge> : <Badge glyph="dash">Rev. {r.number}: cannot be counted</Badge>}
                {!c.countable ? <span className="text-sm text-ink-muted">{c.message}</span> : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <TextField label="Name" hint="For example: Kestrel-2 hot fire 3, Marsh End" value={name} maxLength={160} onChange={(e) => setName(e.target.value)} error={errors.name} />
      <TextField
        label="Crew reports at (optional)"
        hint="Each crew member is e-mailed their station and this time."
        type="datetime-local"
        value={reportAt}
        onChange={(e) => setReportAt(e.target.value)}
        error={errors.reportAt}
      />
      <TextField label="Firing window ends (optional)" type="datetime-local" value={windowEnd} onChange={(e) => setWindowEnd(e.target.value)} error={errors.windowEnd} />
      <FormError title="Count not created" message={create.error ? (isApiError(create.error) && create.error.details.length ? `${create.error.message} ${create.error.details.map((d) => d.message).join(' ')}` : errorMessage(create.error)) : null} />
      <FormActions>
        <Button type="submit" variant="primary" pending={create.isPending} pendingLabel="Creating…">
          Create count
        </Button>
      </FormActions>
    </Form>
  );
}

/** Every count of the team, newest first; a conductor can make a new one from a released procedure. */
export function CountsPage() {
  const me = useSignedInMe();
  const counts = useCounts();
  const mayCreate = me.roles.includes('conductor') || me.roles.includes('admin');
  const [creating, setCreating] = useState(false);
  return (
    <Page
      title="Live count"
      lead="Counts run from a released procedure revision. Open one to follow it, answer polls for your station, or run it as conductor."
      actions={mayCreate && !creating ? <Button variant="primary" onClick={() => setCreating(true)}>New count</Button> : undefined}
    >
      <div className="flex flex-col gap-6">
        {creating ? (
          <Section title="New count">
            <NewCountForm />
            <Button variant="quiet" className="mt-2" onClick={() => setCreating(false)}>
              Cancel
            </Button>
          </Section>
        ) : null}
        <Section title="Counts">
          {counts.isPending ? <Loading /> : null}
          {counts.isError ? (
            <Notice tone="danger" title="Could not load the counts">
              <p>{errorMessage(counts.error)}</p>
            </Notice>
          ) : null}
          {counts.data?.length === 0 ? <p className="text-ink-muted">No counts yet.</p> : null}
          {counts.data?.length ? (
            <ul className="flex flex-col gap-3">
              {counts.data.map((c) => {
                const look = STATUS_LOOK[c.status];
                return (
                  <li key={c.id} className="rounded-md border-2 border-line-soft p-3">
                    <p className="flex flex-wrap items-center gap-2">
                      <Link to={`/counts/${c.id}`} className="text-xl font-bold">
                        {c.name}
                      </Link>
                      <Badge tone={look.tone} glyph={look.glyph}>
                        {look.word}
                      </Badge>
                    </p>
                    <p className="text-sm">
                      {c.procedureName}, revision {c.revisionNumber} · created <Time value={c.createdAt} /> by {c.createdBy.name}
                      {c.startedAt ? (
                        <>
                          {' '}
                          · started <Time value={c.startedAt} />
                        </>
                      ) : null}
                    </p>
                  </li>
                );
              })}
            </ul>
          ) : null}
        </Section>
      </div>
      <SafetyNote />
    </Page>
  );
}
