import { useMemo } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useCreateRiskMatrix } from '../api/createRiskMatrix';
import { useRiskMatrix } from '../api/getRiskMatrix';
import { useUpdateRiskMatrix } from '../api/updateRiskMatrix';
import { canEditHazards } from '../lib/labels';
import { blankMatrixForm, matrixToForm } from '../lib/matrixForm';
import { matrixFromDto } from '../lib/risk';
import { MatrixCaution } from './RiskMatrixPages';
import { RiskMatrixForm } from './RiskMatrixForm';

function NotAllowed() {
  return (
    <Page title="You cannot change risk matrices" kicker="403 · Not allowed">
      <Notice tone="warning" title="This page needs another role">
        <p>Only a Safety officer or an Administrator can define risk matrices. Everyone signed in can read them.</p>
      </Notice>
      <p className="mt-4">
        <Link to="/hazards/matrices">Back to the matrices</Link>
      </p>
    </Page>
  );
}

export function NewRiskMatrixPage() {
  const me = useSignedInMe();
  const [params] = useSearchParams();
  const from = params.get('from');
  if (!canEditHazards(me.roles)) return <NotAllowed />;
  return from ? <NewFromCopy from={from} /> : <NewMatrix />;
}

function NewFromCopy({ from }: { from: string }) {
  const source = useRiskMatrix(from);
  if (source.isPending) return <Loading label="Loading the matrix to copy…" />;
  if (source.isError)
    return (
      <Page title="New risk matrix" kicker="Risk matrices">
        <Notice tone="danger" title="Could not load the matrix to copy">
          <p>{errorMessage(source.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards/matrices/new">Start from a blank matrix instead</Link>
        </p>
      </Page>
    );
  return <NewMatrix copyOf={source.data} />;
}

function NewMatrix({ copyOf }: { copyOf?: Parameters<typeof matrixFromDto>[0] }) {
  const create = useCreateRiskMatrix();
  const navigate = useNavigate();
  const initial = useMemo(() => (copyOf ? matrixToForm(matrixFromDto(copyOf), { copy: true }) : blankMatrixForm()), [copyOf]);
  return (
    <Page
      title="New risk matrix"
      kicker="Risk matrices"
      lead={copyOf ? `Starting from a copy of ${copyOf.name}.` : 'Starting from a blank 3 × 3 grid: name the categories, set the levels, then choose the level of every cell.'}
    >
      <p className="mb-4">
        <Link to="/hazards/matrices">Back to the matrices</Link>
      </p>
      <div className="flex flex-col gap-5">
        <MatrixCaution />
        <RiskMatrixForm
          mode="create"
          initial={initial}
          submitLabel="Save matrix"
          onSubmit={(input) => create.mutateAsync(input).then((m) => navigate(`/hazards/matrices/${encodeURIComponent(m.id)}`))}
          onCancel={() => navigate(copyOf ? `/hazards/matrices/${encodeURIComponent(copyOf.id)}` : '/hazards/matrices')}
        />
      </div>
    </Page>
  );
}

export function EditRiskMatrixPage() {
  const { id = '' } = useParams();
  const me = useSignedInMe();
  const query = useRiskMatrix(id);
  const update = useUpdateRiskMatrix();
  const navigate = useNavigate();
  const initial = useMemo(() => (query.data ? matrixToForm(matrixFromDto(query.data)) : null), [query.data]);
  if (!canEditHazards(me.roles)) return <NotAllowed />;
  if (query.isPending) return <Loading label="Loading the matrix…" />;
  if (query.isError)
    return (
      <Page title="Edit risk matrix" kicker="Risk matrices">
        <Notice tone="danger" title="Could not load this matrix">
          <p>{errorMessage(query.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards/matrices">Back to the matrices</Link>
        </p>
      </Page>
    );
  const m = query.data;
  const back = `/hazards/matrices/${encodeURIComponent(m.id)}`;
  if (m.builtIn || m.hazardCount > 0)
    return (
      <Page title={`Edit ${m.name}`} kicker="Risk matrices">
        <Notice tone="warning" title="This matrix cannot change">
          <p>
            {m.builtIn
              ? 'The built-in matrix is fixed.'
              : `${m.hazardCount} ${m.hazardCount === 1 ? 'hazard was' : 'hazards were'} assessed with it, and a hazard keeps the matrix it was assessed with.`}{' '}
            Copy it into a new matrix to make a revised one.
          </p>
        </Notice>
        <p className="mt-4 flex flex-wrap gap-4">
          <Link to={`/hazards/matrices/new?from=${encodeURIComponent(m.id)}`}>Copy into a new matrix</Link>
          <Link to={back}>Back to the matrix</Link>
        </p>
      </Page>
    );
  return (
    <Page title={`Edit ${m.name}`} kicker="Risk matrices" lead="No hazard has been assessed with this matrix yet, so it can still change.">
      <p className="mb-4">
        <Link to={back}>Back to the matrix</Link>
      </p>
      <div className="flex flex-col gap-5">
        <MatrixCaution />
        <RiskMatrixForm
          mode="edit"
          initial={initial!}
          submitLabel="Save changes"
          onSubmit={({ id: _id, ...input }) => update.mutateAsync({ id: m.id, input }).then(() => navigate(back))}
          onCancel={() => navigate(back)}
        />
      </div>
    </Page>
  );
}
