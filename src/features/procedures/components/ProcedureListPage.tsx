import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router-dom';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import type { ProcedureSummaryDto } from '../../../contract/procedures';
import { errorMessage, isApiError } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useSignedInMe } from '../../../lib/session';
import { procedureCreateInputSchema, useCreateProcedure, type ProcedureCreateInput } from '../api/createProcedure';
import { useImportProcedure } from '../api/importProcedure';
import { useProcedures } from '../api/listProcedures';
import { useStations } from '../api/listStations';
import { canWriteProcedures, pathText } from '../lib/format';
import { ProceduresNav } from './ProceduresNav';
import { TextAreaField } from '../../../components/ui/SelectField';

export function ProcedureListPage() {
  const me = useSignedInMe();
  const canWrite = canWriteProcedures(me.roles);
  const procedures = useProcedures();
  const [creating, setCreating] = useState(false);

  return (
    <Page
      title="Procedures"
      kicker="Procedures"
      actions={
        canWrite && !creating ? (
          <Button variant="primary" onClick={() => setCreating(true)}>
            New procedure
          </Button>
        ) : null
      }
    >
      <ProceduresNav />
      <p className="mb-5 max-w-prose">
        A count runs only from a procedure’s latest released revision, signed by a test conductor and a safety officer. Holdfire is a
        planning and record aid: your site’s own approvals still apply.
      </p>
      {creating ? (
        <Section title="New procedure" className="mb-6">
          <NewProcedureForm onCancel={() => setCreating(false)} />
        </Section>
      ) : null}
      {procedures.isPending ? <Loading label="Loading procedures…" /> : null}
      {procedures.isError ? (
        <Notice tone="danger" title="Could not load the procedures">
          <p>{errorMessage(procedures.error)}</p>
          <Button className="mt-2" onClick={() => void procedures.refetch()}>
            Try again
          </Button>
        </Notice>
      ) : null}
      {procedures.data ? <ProcedureTable procedures={procedures.data} /> : null}
      {canWrite ? (
        <Section title="Import a procedure" className="mt-6">
          <ImportPanel />
        </Section>
      ) : null}
    </Page>
  );
}

function ProcedureTable({ procedures }: { procedures: readonly ProcedureSummaryDto[] }) {
  if (procedures.length === 0) return <p>No procedures yet.</p>;
  return (
    <div role="region" aria-labelledby="procedure-table-caption" tabIndex={0} className="overflow-x-auto rounded-md border-2 border-line">
      <table className="w-full border-collapse text-left max-md:block md:min-w-[48rem]">
        <caption id="procedure-table-caption" className="border-b-2 border-line bg-surface p-3 text-left font-bold max-md:block">
          Procedures ({procedures.length})
        </caption>
        <thead className="bg-sunken max-md:sr-only">
          <tr>
            {['Procedure', 'Test article', 'Site', 'Released', 'Draft', 'Stations'].map((h) => (
              <th key={h} scope="col" className="border-b-2 border-line p-3 font-bold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="max-md:block">
          {procedures.map((p) => (
            <tr key={p.id} className="border-b-2 border-line-soft align-top last:border-b-0 max-md:grid max-md:grid-cols-2 max-md:gap-x-3 max-md:p-2">
              <th scope="row" className="p-3 font-normal max-md:col-span-2 max-md:p-1.5">
                <Link to={`/procedures/${p.id}`} className="text-lg font-bold">
                  {p.name}
                </Link>
              </th>
              <Cell label="Test article">{p.testArticle || '—'}</Cell>
              <Cell label="Site">{p.site || '—'}</Cell>
              <Cell label="Released">
                {p.latestReleased ? (
                  <Badge tone="go" glyph="check">
                    Revision {p.latestReleased.number}
                  </Badge>
                ) : (
                  <Badge tone="neutral" glyph="dash">
                    None yet
                  </Badge>
                )}
              </Cell>
              <Cell label="Draft">
                {p.draft ? (
                  <Badge tone="caution" glyph="clock">
                    Revision {p.draft.number}
                  </Badge>
                ) : (
                  'None open'
                )}
              </Cell>
              <Cell label="Stations">{p.stations.length ? p.stations.join(', ') : '—'}</Cell>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Cell({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <td className="p-3 max-md:p-1.5">
      <span className="block text-sm font-bold text-ink-muted md:hidden">{label}</span>
      {children}
    </td>
  );
}

const CREATE_FIELDS = ['name', 'purpose', 'testArticle', 'site', 'stations'] as const;

function NewProcedureForm({ onCancel }: { onCancel: () => void }) {
  const create = useCreateProcedure();
  const stations = useStations();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<ProcedureCreateInput>({
    resolver: zodResolver(procedureCreateInputSchema) as never,
    defaultValues: { name: '', purpose: '', testArticle: '', site: '', stations: [] },
  });
  const { register, control, handleSubmit, setError, formState } = form;
  const e = formState.errors;

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const p = await create.mutateAsync(values);
      navigate(`/procedures/${p.id}`);
    } catch (error) {
      setFormError(applyServerError(error, setError, CREATE_FIELDS));
    }
  });

  return (
    <Form onSubmit={(event) => void submit(event)} aria-label="New procedure">
      <FormError title="Not created" message={formError} />
      <TextField label="Name" error={e.name?.message} {...register('name')} />
      <TextAreaField label="Purpose" hint="What the test is for and what it records." error={e.purpose?.message} {...register('purpose')} />
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
            error={fieldState.error?.message ?? (Array.isArray(fieldState.error) ? 'One of these stations is not in your team.' : undefined)}
          />
        )}
      />
      <p className="text-sm text-ink-muted">The procedure starts with an empty draft, revision 1, for you to fill in.</p>
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Creating…">
          Create procedure
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

const MAX_FILE_BYTES = 200 * 1024;

type ImportState =
  | { kind: 'idle' }
  | { kind: 'problems'; title: string; problems: { path: string; message: string }[]; phaseNames: (string | undefined)[] }
  | { kind: 'error'; message: string };

/** Reads a Holdfire procedure file and sends it; every problem the server finds is listed at once. */
function ImportPanel() {
  const inputId = useId();
  const hintId = useId();
  const run = useImportProcedure();
  const navigate = useNavigate();
  const [file, setFile] = useState<File | null>(null);
  const [state, setState] = useState<ImportState>({ kind: 'idle' });

  const onImport = async () => {
    setState({ kind: 'idle' });
    if (!file) {
      setState({ kind: 'error', message: 'Choose a procedure file first.' });
      return;
    }
    if (file.size > MAX_FILE_BYTES) {
      setState({ kind: 'error', message: `The file is ${Math.round(file.size / 1024)} kB; Holdfire reads procedure files up to 200 kB.` });
      return;
    }
    let parsed: unknown;
    try {
      parsed = JSON.parse(await file.text());
    } catch {
      setState({ kind: 'error', message: `${file.name} is not a JSON file Holdfire can read. Export procedures from Holdfire to get one.` });
      return;
    }
    if (parsed === null || typeof parsed !== 'object' || Array.isArray(parsed)) {
      setState({ kind: 'error', message: 'The file holds JSON, but not a procedure: it should be one object with "format": "holdfire.procedure".' });
      return;
    }
    try {
      const p = await run.mutateAsync(parsed as Record<string, unknown>);
      navigate(`/procedures/${p.id}`);
    } catch (error) {
      if (isApiError(error) && error.details.length) {
        const phases = (parsed as { phases?: unknown }).phases;
        const phaseNames = Array.isArray(phases) ? phases.map((ph) => (typeof ph?.name === 'string' ? (ph.name as string) : undefined)) : [];
        setState({ kind: 'problems', title: error.message, problems: error.details, phaseNames });
      } else {
        setState({ kind: 'error', message: errorMessage(error) });
      }
    }
  };

  return (
    <div className="flex flex-col gap-4">
      <p className="max-w-prose">
        Bring in a procedure exported from Holdfire (a <code>.holdfire.json</code> file). It becomes a new procedure with one draft revision;
        the stations and hazard codes it names must already exist in your team. A release is always signed again here.
      </p>
      <div className="flex flex-col gap-1">
        <label htmlFor={inputId} className="font-bold">
          Procedure file
        </label>
        <p id={hintId} className="text-sm text-ink-muted">
          JSON, up to 200 kB.
        </p>
        <input
          id={inputId}
          type="file"
          accept=".json,application/json"
          aria-describedby={hintId}
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setState({ kind: 'idle' });
          }}
          className="min-h-12 w-full max-w-md rounded-md border-2 border-line bg-surface p-2 text-ink file:mr-3 file:min-h-10 file:cursor-pointer file:rounded-md file:border-2 file:border-line file:bg-surface file:px-3 file:font-bold file:text-ink"
        />
      </div>
      <div>
        <Button variant="primary" onClick={() => void onImport()} pending={run.isPending} pendingLabel="Importing…">
          Import procedure
        </Button>
      </div>
      {state.kind === 'error' ? (
        <Notice tone="danger" title="Not imported">
          <p>{state.message}</p>
        </Notice>
      ) : null}
      {state.kind === 'problems' ? (
        <Notice tone="danger" title={state.title}>
          <ol className="mt-1 list-decimal space-y-1 pl-6">
            {state.problems.map((p, i) => (
              <li key={`${p.path}-${i}`}>
                <span className="font-bold">{pathText(p.path, (n) => state.phaseNames[n])}:</span> {p.message}
              </li>
            ))}
          </ol>
        </Notice>
      ) : null}
    </div>
  );
}
