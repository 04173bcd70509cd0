import { useSortable } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import { memo } from 'react';
import { Button } from '../../../components/ui/Button';
import { Glyph } from '../../../components/ui/Glyph';
import type { StationDto } from '../../../contract/procedures';
import type { ResolvedCaution } from '../../../domain/procedures/cautions';
import { parseTMinus } from '../../../domain/procedures/tminus';
import type { HazardOption } from '../api/listHazardOptions';
import type { StepDraft } from '../lib/draft';
import { kindLabel } from '../lib/format';
import { CautionCounts, CautionList } from './CautionList';
import { DragHandle } from './DragHandle';
import { StationTag, TimeMark } from './StepView';
import { StepFields } from './StepFields';

export interface StepActions {
  onChange: (key: string, patch: Partial<Omit<StepDraft, 'key'>>) => void;
  onMove: (key: string, delta: -1 | 1) => void;
  onToggle: (key: string) => void;
  onRemove: (key: string) => void;
  onAddAfter: (key: string) => void;
}

function shortTime(step: StepDraft): number | null | 'bad' {
  if (step.time.trim() === '') return null;
  return parseTMinus(step.time) ?? 'bad';
}

export function stepSummary(step: StepDraft, max = 70): string {
  const text = step.instruction.trim() || 'new step, no instruction yet';
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

/** The draft's step as a card: summary and handle always, the fields when opened. */
export const EditorStep = memo(function EditorStep({
  step,
  number,
  phaseName,
  open,
  canUp,
  canDown,
  problems,
  savedCautions,
  stations,
  hazards,
  actions,
}: {
  step: StepDraft;
  number: number;
  phaseName: string;
  open: boolean;
  canUp: boolean;
  canDown: boolean;
  /** Visible problems of this step, by field. */
  problems: ReadonlyMap<string, string>;
  /** The cautions as last saved; null for a step not saved yet. */
  savedCautions: readonly ResolvedCaution[] | null;
  stations: readonly StationDto[];
  hazards: readonly HazardOption[];
  actions: StepActions;
}) {
  const sortable = useSortable({ id: step.key, data: { type: 'step' }, attributes: { roleDescription: 'movable step' } });
  const style = { transform: CSS.Translate.toString(sortable.transform), transition: sortable.transition };
  const t = shortTime(step);
  const stationName = stations.find((s) => s.code === step.station)?.name;
  const summary = stepSummary(step);
  const problemCount = problems.size;
  const bodyId = `step-body-${step.key}`;

  return (
    <li
      ref={sortable.setNodeRef}
      style={style}
      data-step-key={step.key}
      data-step-kind={step.kind}
      className={
        'rounded-md border-2 bg-surface ' +
        (sortable.isDragging ? 'border-dashed border-line-soft opacity-40 ' : problemCount ? 'border-danger border-[3px] ' : 'border-line ')
      }
    >
      <div className="grid grid-cols-[auto_minmax(0,1fr)] gap-2 p-2 sm:gap-3 sm:p-3 lg:grid-cols-[auto_minmax(0,1fr)_auto]">
        <DragHandle
          label={`Move step ${number}: ${summary}`}
          attributes={sortable.attributes}
          listeners={sortable.listeners}
          handleRef={sortable.setActivatorNodeRef}
        />
        <div className="min-w-0">
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span className="text-sm font-bold uppercase tracking-wider text-ink-muted">Step {number}</span>
            {t === 'bad' ? <span className="font-mono font-bold text-danger">{step.time}</span> : <TimeMark tSeconds={t} />}
            {step.station ? <StationTag code={step.station} name={stationName} /> : null}
            <span className="text-sm font-bold">{kindLabel(step.kind)}</span>
          </p>
          {open ? null : (
            <p className={`mt-1 break-words ${step.instruction.trim() ? '' : 'italic text-ink-muted'}`}>{step.instruction.trim() || 'New step: no instruction yet.'}</p>
          )}
          <div className="mt-1 flex flex-wrap items-center gap-x-3 gap-y-1">
            {savedCautions ? <CautionCounts cautions={savedCautions} /> : <span className="text-sm text-ink-muted">Cautions appear once saved</span>}
            {problemCount ? (
              <span className="inline-flex items-center gap-1 text-sm font-bold text-danger">
                <Glyph shape="diamond" />
                {problemCount} problem{problemCount === 1 ? '' : 's'}
                {open ? '' : `: ${[...problems.values()][0]}`}
              </span>
            ) : null}
          </div>
        </div>
        <div className="col-span-2 flex flex-wrap gap-2 lg:col-span-1">
          <Button
            onClick={() => actions.onToggle(step.key)}
            aria-expanded={open}
            aria-controls={open ? bodyId : undefined}
            variant={open ? 'primary' : 'secondary'}
            data-step-toggle={step.key}
          >
            {open ? 'Done editing' : 'Edit step'}
            <span className="sr-only"> {number}</span>
          </Button>
          <Button onClick={() => actions.onMove(step.key, -1)} disabled={!canUp} aria-label={`Move step ${number} up`} data-move={`${step.key}:up`}>
            <span aria-hidden="true">▲</span> Up
          </Button>
          <Button onClick={() => actions.onMove(step.key, 1)} disabled={!canDown} aria-label={`Move step ${number} down`} data-move={`${step.key}:down`}>
            <span aria-hidden="true">▼</span> Down
          </Button>
        </div>
      </div>
      {open ? (
        <div id={bodyId} className="flex flex-col gap-4 border-t-2 border-line-soft p-3">
          <StepFields
            step={step}
            number={number}
            onChange={(patch) => actions.onChange(step.key, patch)}
            problems={problems}
            stations={stations}
            hazards={hazards}
          />
          {savedCautions && savedCautions.length ? (
            <details className="rounded-md border-2 border-line-soft p-2">
              <summary className="min-h-11 py-2 font-bold">Cautions as last saved ({savedCautions.length})</summary>
              <CautionList cautions={savedCautions} label={`Cautions for step ${number} as last saved`} compact />
            </details>
          ) : null}
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => actions.onAddAfter(step.key)}>Add a step below</Button>
            <Button variant="danger" onClick={() => actions.onRemove(step.key)}>
              Remove step {number}
            </Button>
          </div>
          <p className="sr-only">In {phaseName}.</p>
        </div>
      ) : null}
    </li>
  );
});

/** What follows the pointer while a step is dragged: the step's summary, lifted. */
export function StepDragPreview({ step, number }: { step: StepDraft; number: number }) {
  const t = shortTime(step);
  return (
    <div className="flex cursor-grabbing gap-3 rounded-md border-[3px] border-line bg-surface p-3 shadow-lg">
      <span className="flex size-12 shrink-0 items-center justify-center rounded-md border-2 border-line bg-selected" aria-hidden="true">
        <svg viewBox="0 0 16 24" className="h-7 w-5">
          {[5, 11].map((x) => [5, 12, 19].map((y) => <circle key={`${x}-${y}`} cx={x} cy={y} r="2.2" fill="currentColor" />))}
        </svg>
      </span>
      <div className="min-w-0">
        <p className="flex flex-wrap items-center gap-x-3">
          <span className="text-sm font-bold uppercase tracking-wider text-ink-muted">Step {number}</span>
          {t === 'bad' ? <span className="font-mono font-bold">{step.time}</span> : <TimeMark tSeconds={t} />}
          <span className="font-bold">{step.station}</span>
        </p>
        <p className="break-words">{stepSummary(step)}</p>
      </div>
    </div>
  );
}
