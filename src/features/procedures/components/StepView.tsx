import type { ReactNode } from 'react';
import type { PhaseDto, StepDto, StationDto } from '../../../contract/procedures';
import type { Step } from '../../../domain/procedures/steps';
import { kindLabel, propellantName, stepFacts, tLabel } from '../lib/format';
import { CautionList } from './CautionList';

export interface Lookups {
  stationName: (code: string) => string | undefined;
  hazardLabel: (id: number) => string;
}

export function makeLookups(stations: readonly StationDto[] | undefined, hazards: readonly { id: number; code: string; title: string }[] | undefined): Lookups {
  const byCode = new Map((stations ?? []).map((s) => [s.code, s.name]));
  const byId = new Map((hazards ?? []).map((h) => [h.id, h]));
  return {
    stationName: (code) => byCode.get(code),
    hazardLabel: (id) => {
      const h = byId.get(id);
      return h ? `${h.code} ${h.title}` : `hazard ${id}`;
    },
  };
}

/** The count time as the crew reads it: big, fixed-width; an untimed step says so in words. */
export function TimeMark({ tSeconds, className = '' }: { tSeconds: number | null; className?: string }) {
  return tSeconds === null ? (
    <span className={`font-mono text-base italic text-ink-muted ${className}`}>untimed</span>
  ) : (
    <span className={`font-mono text-xl font-bold tabular-nums text-ink ${className}`}>{tLabel(tSeconds)}</span>
  );
}

export function StationTag({ code, name }: { code: string; name?: string }) {
  return (
    <span className="inline-flex items-center gap-1 rounded-sm border-2 border-line px-1.5 py-0.5 text-sm font-bold leading-tight">
      <span>{code}</span>
      {name ? <span className="font-normal text-ink-muted">{name}</span> : null}
    </span>
  );
}

/** What a step says beyond its instruction: kind facts, links. */
export function StepDetails({ step, lookups }: { step: Step; lookups: Lookups }) {
  const facts = stepFacts(step);
  const rows: { label: string; value: ReactNode }[] = [...facts];
  if (step.kind === 'poll' && step.stations.length) {
    rows[0] = {
      label: 'Stations answering',
      value: step.stations.map((c) => (lookups.stationName(c) ? `${c} (${lookups.stationName(c)})` : c)).join(', '),
    };
  }
  if (step.hazardIds.length) rows.push({ label: 'Hazards', value: step.hazardIds.map(lookups.hazardLabel).join('; ') });
  if (step.propellants.length) rows.push({ label: 'Propellants', value: step.propellants.map(propellantName).join(', ') });
  if (!rows.length) return null;
  return (
    <dl className="mt-2 grid gap-x-3 gap-y-1 text-base sm:grid-cols-[max-content_minmax(0,1fr)]">
      {rows.map((r) => (
        <div key={r.label} className="contents">
          <dt className="font-bold">{r.label}</dt>
          <dd className="min-w-0 break-words">{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** One step, read-only: time, station, kind, instruction and facts beside its cautions. */
export function StepCard({ step, number, lookups, children }: { step: StepDto; number: number; lookups: Lookups; children?: ReactNode }) {
  return (
    <li className="rounded-md border-2 border-line bg-surface p-3" data-step-key={step.key} data-step-kind={step.kind}>
      <div className="grid gap-3 lg:grid-cols-[minmax(0,1fr)_minmax(0,24rem)]">
        <div className="min-w-0">
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span className="text-sm font-bold uppercase tracking-wider text-ink-muted">Step {number}</span>
            <TimeMark tSeconds={step.tSeconds} />
            <StationTag code={step.station} name={lookups.stationName(step.station)} />
            <span className="text-sm font-bold">{kindLabel(step.kind)}</span>
          </p>
          <p className="mt-1 text-lg">{step.instruction}</p>
          <StepDetails step={step} lookups={lookups} />
        </div>
        <div className="min-w-0">
          <CautionList cautions={step.cautions} label={`Cautions for step ${number}`} />
        </div>
      </div>
      {children}
    </li>
  );
}

/** Running step numbers across the whole revision, phase by phase. */
export function firstNumbers(phases: readonly { steps: readonly unknown[] }[]): number[] {
  const out: number[] = [];
  let n = 1;
  for (const p of phases) {
    out.push(n);
    n += p.steps.length;
  }
  return out;
}

export function PhaseList({
  phases,
  lookups,
  stepExtra,
}: {
  phases: readonly PhaseDto[];
  lookups: Lookups;
  /** Shown at the foot of each step's card (its attachments). */
  stepExtra?: (step: StepDto, number: number) => ReactNode;
}) {
  const starts = firstNumbers(phases);
  return (
    <div className="flex flex-col gap-6">
      {phases.map((phase, p) => (
        <section key={phase.key} aria-labelledby={`phase-${phase.key}`} className="min-w-0">
          <h2 id={`phase-${phase.key}`} className="mb-3 border-b-2 border-line pb-1 text-2xl font-bold">
            {p + 1}. {phase.name}
            <span className="ml-2 text-base font-normal text-ink-muted">
              {phase.steps.length} step{phase.steps.length === 1 ? '' : 's'}
            </span>
          </h2>
          {phase.steps.length === 0 ? (
            <p className="text-ink-muted">No steps in this phase.</p>
          ) : (
            <ol className="flex flex-col gap-3" aria-label={`Steps of ${phase.name}`}>
              {phase.steps.map((step, i) => (
                <StepCard key={step.key} step={step} number={starts[p]! + i} lookups={lookups}>
                  {stepExtra?.(step, starts[p]! + i)}
                </StepCard>
              ))}
            </ol>
          )}
        </section>
      ))}
    </div>
  );
}
