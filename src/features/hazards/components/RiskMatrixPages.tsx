import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { BUILT_IN_MATRIX_ID } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { Button, buttonClasses } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { errorMessage, isApiError } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useRiskMatrix } from '../api/getRiskMatrix';
import { useRiskMatrices } from '../api/listRiskMatrices';
import { useReinstateRiskMatrix } from '../api/reinstateRiskMatrix';
import { useRetireRiskMatrix } from '../api/retireRiskMatrix';
import { useSetDefaultRiskMatrix } from '../api/setDefaultRiskMatrix';
import { canEditHazards } from '../lib/labels';
import { levelsWorstFirst, matrixFromDto, type MatrixView } from '../lib/risk';
import { HazardsNav } from './HazardsNav';
import { AcceptanceList, AxisDefinitions, MatrixGrid } from './MatrixGrid';
import { RiskBadge } from './RiskBadge';

/** Shown wherever matrices are read or changed: the grid is the team's judgement, not Holdfire's. */
export function MatrixCaution() {
  return (
    <Notice tone="warning" title="Your team decides, not Holdfire">
      <p>
        Holdfire is a planning and record aid, not a safety authority. A matrix only sorts hazards; what risk is acceptable, and who may accept it,
        is set by your site&apos;s governing code, its licensed authority and your team&apos;s own safety practice.
      </p>
    </Notice>
  );
}

function MatrixBadges({ m }: { m: MatrixView }) {
  return (
    <span className="flex flex-wrap gap-2">
      <Badge glyph={m.builtIn ? 'square' : 'person'}>{m.builtIn ? 'Built in' : 'Team matrix'}</Badge>
      {m.isDefault ? <Badge tone="go" glyph="check">Default for new hazards</Badge> : null}
      {m.retired ? <Badge tone="caution" glyph="triangle">Retired</Badge> : null}
    </span>
  );
}

const hazardsWord = (n: number) => `${n} ${n === 1 ? 'hazard' : 'hazards'}`;

export function RiskMatricesPage() {
  const me = useSignedInMe();
  const canEdit = canEditHazards(me.roles);
  const list = useRiskMatrices();
  return (
    <Page
      title="Risk matrices"
      kicker="Hazards"
      lead="How a severity and a likelihood become a risk level, and who must accept each level. A hazard keeps the matrix it was assessed with."
      actions={
        canEdit ? (
          <Link to="/hazards/matrices/new" className={buttonClasses('primary')}>
            New matrix
          </Link>
        ) : null
      }
    >
      <HazardsNav />
      <div className="flex flex-col gap-4">
        <MatrixCaution />
        {list.isPending ? <Loading label="Loading matrices…" /> : null}
        {list.isError ? (
          <Notice tone="danger" title="Could not load the matrices">
            <p>{errorMessage(list.error)}</p>
            <Button className="mt-2" onClick={() => void list.refetch()}>
              Try again
            </Button>
          </Notice>
        ) : null}
        {list.data ? (
          <ul className="grid gap-3 md:grid-cols-2">
            {list.data.map(matrixFromDto).map((m) => (
              <li key={m.id} className="flex min-w-0 flex-col gap-2 rounded-md border-2 border-line bg-surface p-4">
                <h2 className="text-xl font-bold leading-tight [overflow-wrap:anywhere]">
                  <Link to={`/hazards/matrices/${encodeURIComponent(m.id)}`}>{m.name}</Link>
                </h2>
                <MatrixBadges m={m} />
                <p>
                  {m.severities.length} severity {m.severities.length === 1 ? 'category' : 'categories'} × {m.likelihoods.length} likelihood{' '}
                  {m.likelihoods.length === 1 ? 'level' : 'levels'} · used by {hazardsWord(m.hazardCount)}
                </p>
                <ul className="flex flex-wrap gap-2" aria-label={`Risk levels of ${m.name}`}>
                  {levelsWorstFirst(m).map((l) => (
                    <li key={l.key}>
                      <RiskBadge level={l} />
                    </li>
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </Page>
  );
}

export function RiskMatrixPage() {
  const { id = '' } = useParams();
  const me = useSignedInMe();
  const canEdit = canEditHazards(me.roles);
  const query = useRiskMatrix(id);
  const retire = useRetireRiskMatrix();
  const reinstate = useReinstateRiskMatrix();
  const makeDefault = useSetDefaultRiskMatrix();
  const [actionError, setActionError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  if (query.isPending) return <Loading label="Loading the matrix…" />;
  if (query.isError) {
    const missing = isApiError(query.error) && query.error.status < 500;
    return (
      <Page title={missing ? 'Matrix not found' : 'Risk matrix'} kicker="Risk matrices">
        <Notice tone={missing ? 'warning' : 'danger'} title={missing ? 'Not found' : 'Could not load this matrix'}>
          <p>{errorMessage(query.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards/matrices">Back to the matrices</Link>
        </p>
      </Page>
    );
  }
  const m = matrixFromDto(query.data);
  const run = (action: () => Promise<unknown>, message: string) => {
    setActionError(null);
    setDone(null);
    action().then(
      () => setDone(message),
      (error: unknown) => setActionError(errorMessage(error)),
    );
  };
  const busy = retire.isPending || reinstate.isPending || makeDefault.isPending;

  return (
    <Page title={m.name} kicker="Risk matrix">
      <HazardsNav />
      <p className="mb-4">
        <Link to="/hazards/matrices">All matrices</Link>
      </p>
      <div className="flex flex-col gap-6">
        <div className="flex flex-col gap-2">
          <MatrixBadges m={m} />
          <p>
            Used by {hazardsWord(m.hazardCount)}.
            {m.hazardCount > 0 && !m.builtIn ? ' It can no longer change: those hazards keep the matrix they were assessed with.' : ''}
            {m.retired ? ' Retired: kept for the hazards assessed with it, offered for no new hazard.' : ''}
          </p>
        </div>
        <MatrixCaution />
        <Section title="Matrix">
          <MatrixGrid matrix={m} />
        </Section>
        <Section title="What the categories mean">
          <div className="grid gap-6 md:grid-cols-2">
            <AxisDefinitions title="Severity" entries={m.severities} />
            <AxisDefinitions title="Likelihood" entries={m.likelihoods} />
          </div>
          {m.builtIn ? (
            <p className="mt-3 text-ink-muted">The full definitions of each category are in MIL-STD-882E, Tables I and II.</p>
          ) : null}
        </Section>
        <Section title="Who accepts each level">
          <AcceptanceList matrix={m} acceptanceMap={m.acceptanceMap} />
        </Section>
        {canEdit ? (
          <Section title="Manage this matrix">
            <div className="flex flex-col gap-3">
              {done ? (
                <Notice tone="success" title="Done">
                  <p>{done}</p>
                </Notice>
              ) : null}
              {actionError ? (
                <Notice tone="danger" title="Not changed">
                  <p>{actionError}</p>
                </Notice>
              ) : null}
              <div className="flex flex-wrap gap-2">
                {!m.builtIn && m.hazardCount === 0 ? (
                  <Link to={`/hazards/matrices/${encodeURIComponent(m.id)}/edit`} className={buttonClasses('primary')}>
                    Edit matrix
                  </Link>
                ) : null}
                <Link to={`/hazards/matrices/new?from=${encodeURIComponent(m.id)}`} className={buttonClasses('secondary')}>
                  Copy into a new matrix
                </Link>
                {!m.isDefault && !m.retired ? (
                  <Button disabled={busy} onClick={() => run(() => makeDefault.mutateAsync(m.id), `${m.name} is now the default for new hazards.`)}>
                    Make default for new hazards
                  </Button>
                ) : null}
                {!m.builtIn && !m.retired ? (
                  <Button variant="danger" disabled={busy} onClick={() => run(() => retire.mutateAsync(m.id), `${m.name} is retired. Hazards assessed with it keep it.`)}>
                    Retire matrix
                  </Button>
                ) : null}
                {!m.builtIn && m.retired ? (
                  <Button disabled={busy} onClick={() => run(() => reinstate.mutateAsync(m.id), `${m.name} can be chosen for new hazards again.`)}>
                    Reinstate matrix
                  </Button>
                ) : null}
                {m.isDefault && m.id !== BUILT_IN_MATRIX_ID ? (
                  <Button disabled={busy} onClick={() => run(() => makeDefault.mutateAsync(BUILT_IN_MATRIX_ID), 'The built-in matrix is the default again.')}>
                    Use the built-in matrix as default
                  </Button>
                ) : null}
              </div>
              {!m.builtIn && m.hazardCount > 0 ? (
                <p className="text-ink-muted">To revise it, copy it into a new matrix, then retire this one.</p>
              ) : null}
            </div>
          </Section>
        ) : null}
      </div>
    </Page>
  );
}
