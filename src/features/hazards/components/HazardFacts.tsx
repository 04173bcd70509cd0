import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { BUILT_IN_MATRIX_ID, type HazardDto } from '../../../contract/hazards';
import { Time } from '../../../components/ui/Time';
import { PHASE_LABELS, propellantName, SYSTEM_LABELS } from '../lib/labels';
import { useMatrixCatalogue } from '../api/listRiskMatrices';
import { likelihoodTextIn, riskLevelOf, severityTextIn } from '../lib/risk';
import { RiskBadge } from './RiskBadge';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <>
      <dt className="font-bold">{term}</dt>
      <dd className="min-w-0">{children}</dd>
    </>
  );
}

function TextList({ items, empty }: { items: readonly string[]; empty: string }) {
  if (items.length === 0) return <span className="text-ink-muted">{empty}</span>;
  return (
    <ol className="list-decimal space-y-1 pl-6">
      {items.map((item, i) => (
        <li key={i}>{item}</li>
      ))}
    </ol>
  );
}

/** Every recorded field of a hazard, read-only; used on the detail page and in the printed report. */
export function HazardFacts({ hazard }: { hazard: HazardDto }) {
  // The levels are the server's, drawn with the matrix the hazard was assessed with.
  const { catalogue } = useMatrixCatalogue(hazard.matrixId !== BUILT_IN_MATRIX_ID);
  const matrix = catalogue.get(hazard.matrixId);
  const initial = riskLevelOf(matrix, hazard.initialRisk);
  const residual = hazard.residualSeverity === null || hazard.residualLikelihood === null ? null : riskLevelOf(matrix, hazard.residualRisk);
  const severityText = (key: string) => severityTextIn(matrix, key);
  const likelihoodText = (key: string) => likelihoodTextIn(matrix, key);
  return (
    <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-[12rem_minmax(0,1fr)]">
      <Row term="Code">{hazard.code}</Row>
      <Row term="System">{SYSTEM_LABELS[hazard.system] ?? hazard.system}</Row>
      <Row term="Phase">{PHASE_LABELS[hazard.phase] ?? hazard.phase}</Row>
      <Row term="Description">{hazard.description ? <p className="whitespace-pre-line">{hazard.description}</p> : <span className="text-ink-muted">None given</span>}</Row>
      <Row term="Causes">
        <TextList items={hazard.causes} empty="None listed" />
      </Row>
      <Row term="Effects">
        <TextList items={hazard.effects} empty="None listed" />
      </Row>
      <Row term="Propellants">{hazard.propellants.length ? hazard.propellants.map(propellantName).join(', ') : <span className="text-ink-muted">None</span>}</Row>
      <Row term="Energy sources">
        <TextList items={hazard.energies} empty="None listed" />
      </Row>
      <Row term="Initial risk">
        <span className="flex flex-wrap items-center gap-2">
          <RiskBadge level={initial} />
          <span>
            Severity {severityText(String(hazard.initialSeverity))}, likelihood {likelihoodText(hazard.initialLikelihood)}
          </span>
        </span>
      </Row>
      <Row term="Residual risk">
        {residual ? (
          <span className="flex flex-wrap items-center gap-2">
            <RiskBadge level={residual} />
            <span>
              Severity {severityText(String(hazard.residualSeverity))}, likelihood {likelihoodText(String(hazard.residualLikelihood))}
            </span>
          </span>
        ) : (
          <span className="text-ink-muted">Not assessed yet</span>
        )}
      </Row>
      <Row term="Matrix">
        <Link to={`/hazards/matrices/${encodeURIComponent(hazard.matrixId)}`}>{matrix?.name ?? hazard.matrixId}</Link>
        <span className="hf-no-print block text-sm text-ink-muted">A hazard keeps the matrix it was first assessed with.</span>
      </Row>
      <Row term="Recorded">
        <Time value={hazard.createdAt} />
      </Row>
      <Row term="Last changed">
        <Time value={hazard.updatedAt} />
      </Row>
    </dl>
  );
}
