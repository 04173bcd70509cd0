import { useId } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import type { DiffDto, ProcedureDto } from '../../../contract/procedures';
import type { StepPlace } from '../../../domain/procedures/diff';
import type { Step } from '../../../domain/procedures/steps';
import { errorMessage } from '../../../lib/api';
import { useDiff } from '../api/getDiff';
import { useProcedure } from '../api/getProcedure';
import { useHazardOptions } from '../api/listHazardOptions';
import { fieldLabel, fieldValueText, idParam, kindLabel, tLabel } from '../lib/format';
import { ProcedureLoadError, ProcedureMissing } from './ProcedurePage';
import { ProceduresNav } from './ProceduresNav';

export function DiffPage() {
  const id = idParam(useParams().id);
  if (id === null) return <ProcedureMissing />;
  return <DiffView id={id} />;
}

function RevisionSelect({ label, value, onChange, procedure }: { label: string; value: number | null; onChange: (n: number) => void; procedure: ProcedureDto }) {
  const id = useId();
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      <select
        id={id}
        value={value ?? ''}
        onChange={(e) => onChange(Number(e.target.value))}
        className="min-h-12 w-full rounded-md border-2 border-line bg-surface px-2 text-ink"
      >
        {procedure.revisions.map((r) => (
          <option key={r.number} value={r.number}>
            Revision {r.number} ({r.status === 'released' ? 'released' : 'draft'})
          </option>
        ))}
      </select>
    </div>
  );
}

function DiffView({ id }: { id: number }) {
  const procedure = useProcedure(id);
  const [params, setParams] = useSearchParams();
  const revs = procedure.data?.revisions ?? [];
  const pick = (key: 'from' | 'to', fallback: number | undefined) => {
    const n = idParam(params.get(key) ?? undefined);
    return n !== null && revs.some((r) => r.number === n) ? n : (fallback ?? null);
  };
  const from = pick('from', revs.at(-2)?.number ?? revs.at(-1)?.number);
  const to = pick('to', revs.at(-1)?.number);
  const diff = useDiff(id, from, to);
  const hazards = useHazardOptions();

  if (procedure.isPending) return <Loading label="Loading procedure…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  const p = procedure.data;
  const codeOf = (hid: number) => hazards.data?.find((h) => h.id === hid)?.code ?? `hazard ${hid}`;
  const set = (key: 'from' | 'to', n: number) =>
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        next.set('from', String(key === 'from' ? n : from));
        next.set('to', String(key === 'to' ? n : to));
        return next;
      },
      { replace: true },
    );

  return (
    <Page title="Compare revisions" kicker={p.name}>
      <ProceduresNav />
      <p className="mb-4">
        <Link to={`/procedures/${p.id}`}>Back to the procedure</Link>
      </p>
      <div className="mb-6 grid max-w-2xl gap-4 sm:grid-cols-2">
        <RevisionSelect label="From (older)" value={from} onChange={(n) => set('from', n)} procedure={p} />
        <RevisionSelect label="To (newer)" value={to} onChange={(n) => set('to', n)} procedure={p} />
      </div>
      {from === to ? <p className="mb-4">Choose two different revisions to see what changed.</p> : null}
      {diff.isPending && from !== null ? <Loading label="Comparing…" /> : null}
      {diff.isError ? (
        <Notice tone="danger" title="Could not compare">
          <p>{errorMessage(diff.error)}</p>
        </Notice>
      ) : null}
      {diff.data && from !== to ? <DiffResult diff={diff.data} codeOf={codeOf} /> : null}
    </Page>
  );
}

const place = (at: StepPlace) => `${at.phaseName}, step ${at.index + 1}`;

function StepLine({ step }: { step: Step }) {
  return (
    <span>
      <span className="font-mono font-bold">{tLabel(step.tSeconds)}</span> · <span className="font-bold">{step.station}</span> · {kindLabel(step.kind)}:{' '}
      {step.instruction}
    </span>
  );
}

function DiffResult({ diff, codeOf }: { diff: DiffDto; codeOf: (id: number) => string }) {
  const { phases } = diff;
  const phaseChanges = phases.added.length + phases.removed.length + phases.renamed.length + phases.moved.length;
  const nothing = !phaseChanges && !diff.added.length && !diff.removed.length && !diff.changed.length && !diff.moved.length;
  return (
    <div className="flex flex-col gap-6">
      <p role="status" className="text-lg font-bold">
        From revision {diff.from} to revision {diff.to}: {diff.added.length} added, {diff.removed.length} removed, {diff.changed.length} changed,{' '}
        {diff.moved.length} moved, {diff.unchanged} unchanged.
      </p>
      {nothing ? <p>The two revisions have the same phases and steps.</p> : null}
      {phaseChanges ? (
        <Section title="Phases">
          <ul className="list-disc space-y-1 pl-6">
            {phases.added.map((x) => (
              <li key={`a-${x.key}`}>Added: {x.name}</li>
            ))}
            {phases.removed.map((x) => (
              <li key={`r-${x.key}`}>Removed: {x.name}</li>
            ))}
            {phases.renamed.map((x) => (
              <li key={`n-${x.key}`}>
                Renamed: {x.from} → {x.to}
              </li>
            ))}
            {phases.moved.map((x) => (
              <li key={`m-${x.key}`}>Moved in the order: {x.name}</li>
            ))}
          </ul>
        </Section>
      ) : null}
      {diff.added.length ? (
        <Section title={`Steps added (${diff.added.length})`}>
          <ul className="flex flex-col gap-2">
            {diff.added.map((x) => (
              <li key={x.key} className="rounded-md border-2 border-l-8 border-go p-2">
                <span className="block text-sm font-bold">+ Added at {place(x.at)}</span>
                <StepLine step={x.step} />
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
      {diff.removed.length ? (
        <Section title={`Steps removed (${diff.removed.length})`}>
          <ul className="flex flex-col gap-2">
            {diff.removed.map((x) => (
              <li key={x.key} className="rounded-md border-2 border-dashed border-l-8 border-danger p-2">
                <span className="block text-sm font-bold">− Removed from {place(x.at)}</span>
                <span className="line-through decoration-2">
                  <StepLine step={x.step} />
                </span>
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
      {diff.changed.length ? (
        <Section title={`Steps changed (${diff.changed.length})`}>
          <ul className="flex flex-col gap-3">
            {diff.changed.map((c) => (
              <li key={c.key} className="rounded-md border-2 border-line p-2">
                <p className="font-bold">Changed at {place(c.at)}: {c.fields.map(fieldLabel).join(', ')}</p>
                <dl className="mt-1 flex flex-col gap-2">
                  {c.fields.map((f) => (
                    <div key={f} className="grid gap-x-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
                      <dt className="font-bold">{fieldLabel(f)}</dt>
                      <dd className="min-w-0 break-words">
                        <span className="block">
                          <span className="font-bold">Before:</span> {fieldValueText(f, c.before[f], codeOf)}
                        </span>
                        <span className="block">
                          <span className="font-bold">After:</span> {fieldValueText(f, c.after[f], codeOf)}
                        </span>
                      </dd>
                    </div>
                  ))}
                </dl>
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
      {diff.moved.length ? (
        <Section title={`Steps moved (${diff.moved.length})`}>
          <ul className="flex flex-col gap-2">
            {diff.moved.map((m) => (
              <li key={m.key} className="rounded-md border-2 border-line-soft p-2">
                <span className="block text-sm font-bold">
                  ↕ From {place(m.from)} to {place(m.to)}
                </span>
                <StepLine step={m.step} />
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
    </div>
  );
}
