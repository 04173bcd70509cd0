import type { ReactNode } from 'react';
import type { HazardDto } from '../../../contract/hazards';
import { Time } from '../../../components/ui/Time';
import { PHASE_LABELS, propellantName, SYSTEM_LABELS } from '../lib/labels';
import { levelFor, likelihoodText, severityText } from '../lib/risk';
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
  const initial = levelFor(String(hazard.initialSeverity), hazard.initialLikelihood);
  const residual = hazard.residualSeverity === null || hazard.residualLikelihood === null ? null : levelFor(String(hazard.residualSeverity), hazard.residualLikelihood);
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
      <Row term="Matrix">{hazard.matrixId}</Row>
      <Row term="Recorded">
        <Time value={hazard.createdAt} />
      </Row>
      <Row term="Last changed">
        <Time value={hazard.updatedAt} />
      </Row>
    </dl>
  );
}
