import {
  DndContext,
  DragOverlay,
  KeyboardSensor,
  MouseSensor,
  TouchSensor,
  closestCenter,
  pointerWithin,
  useDroppable,
  useSensor,
  useSensors,
  type Announcements,
  type CollisionDetection,
  type DragEndEvent,
  type DragOverEvent,
  type DragStartEvent,
} from '@dnd-kit/core';
import { SortableContext, sortableKeyboardCoordinates, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { useCallback, useDeferredValue, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Section } from '../../../components/ui/Page';
import type { RevisionDto, StationDto } from '../../../contract/procedures';
import type { ResolvedCaution } from '../../../domain/procedures/cautions';
import { errorMessage, isApiError } from '../../../lib/api';
import type { HazardOption } from '../api/listHazardOptions';
import { useSaveDraft } from '../api/saveDraft';
import {
  blankPhase,
  blankStep,
  canMoveStep,
  draftToContent,
  findStep,
  insertStep,
  movePhase,
  moveStepBy,
  moveStepTo,
  phasesToDraft,
  removeStep,
  sameDraft,
  stepTotal,
  updateStep,
  type PhaseDraft,
  type StepDraft,
} from '../lib/draft';
import { pathText, RELEASE_CAUTION } from '../lib/format';
import { checkDraft, serverProblems, stepProblemsAt } from '../lib/validate';
import { EditorStep, StepDragPreview, stepSummary, type StepActions } from './EditorStep';
import { LeaveGuard } from './LeaveGuard';
import { PhaseOrder, type PhaseActions } from './PhaseOrder';

const PHASE_DROP = 'phase-drop:';

/**
 * The draft editor. The draft lives here until Save; every change is checked at once by the same rules
 * the server applies, and each problem is shown at its field (and on the step's card when it is closed).
 */
export function DraftEditor({
  revision,
  stations,
  hazards,
  refs,
}: {
  revision: RevisionDto;
  stations: readonly StationDto[];
  hazards: readonly HazardOption[];
  refs: { stations: ReadonlySet<string>; hazardIds: ReadonlySet<number> };
}) {
  const save = useSaveDraft();
  const initial = useMemo(() => phasesToDraft(revision.phases), [revision]);
  const [baseline, setBaseline] = useState<PhaseDraft[]>(initial);
  const [phases, setPhasesRaw] = useState<PhaseDraft[]>(initial);
  const [open, setOpen] = useState<ReadonlySet<string>>(() => new Set());
  // New steps keep quiet about their empty fields until someone has typed in them or tried to save.
  const [fresh, setFresh] = useState<ReadonlySet<string>>(() => new Set());
  const [showAll, setShowAll] = useState(false);
  const [server, setServer] = useState<{ problems: Map<string, string>; message: string } | null>(null);
  const [saved, setSaved] = useState<{ cleared: boolean } | null>(null);
  const [removed, setRemoved] = useState<{ step: StepDraft; phase: number; index: number } | null>(null);
  const [said, setSaid] = useState('');
  const [activeKey, setActiveKey] = useState<string | null>(null);
  const [cautions, setCautions] = useState<Map<string, ResolvedCaution[]>>(() => cautionMap(revision));
  const focusAfter = useRef<string | null>(null);
  const summaryRef = useRef<HTMLDivElement>(null);
  const beforeDrag = useRef<PhaseDraft[] | null>(null);
  const latest = useRef(phases);
  latest.current = phases;

  const dirty = !sameDraft(phases, baseline);

  /** Every change goes through here: it drops the server's positional problems, which no longer fit. */
  const setPhases = useCallback((update: (prev: PhaseDraft[]) => PhaseDraft[]) => {
    setPhasesRaw((prev) => update(prev));
    setServer(null);
    setSaved(null);
  }, []);

  const deferred = useDeferredValue(phases);
  const check = useMemo(() => checkDraft(deferred, refs), [deferred, refs]);
  const visible = useMemo(() => {
    const map = new Map<string, string>();
    for (const [path, message] of check.problems) {
      const m = /^phases\.(\d+)\.steps\.(\d+)\./.exec(path);
      const step = m ? deferred[Number(m[1])]?.steps[Number(m[2])] : undefined;
      if (!showAll && step && fresh.has(step.key)) continue;
      map.set(path, message);
    }
    if (server) for (const [path, message] of server.problems) if (!map.has(path)) map.set(path, message);
    return map;
  }, [check, deferred, fresh, showAll, server]);

  const numbers = useMemo(() => {
    const out = new Map<string, number>();
    let n = 1;
    for (const p of phases) for (const s of p.steps) out.set(s.key, n++);
    return out;
  }, [phases]);

  // Keep the focus on the moved step's button, even when the move took it into another phase.
  useEffect(() => {
    if (!focusAfter.current) return;
    const el = document.querySelector<HTMLElement>(`[data-move="${focusAfter.current}"]`);
    const fallback = document.querySelector<HTMLElement>(`[data-step-toggle="${focusAfter.current.split(':')[0]}"]`);
    (el && !(el as HTMLButtonElement).disabled ? el : fallback)?.focus();
    focusAfter.current = null;
  });

  const placeWords = (list: readonly PhaseDraft[], key: string) => {
    const at = findStep(list, key);
    if (!at) return '';
    const phase = list[at.phase]!;
    return `step ${at.index + 1} of ${phase.steps.length} in ${phase.name.trim() || `phase ${at.phase + 1}`}`;
  };

  const stepActions: StepActions = useMemo(
    () => ({
      onChange: (key, patch) => {
        setPhases((prev) => updateStep(prev, key, patch));
        setFresh((prev) => {
          if (!prev.has(key)) return prev;
          const next = new Set(prev);
          next.delete(key);
          return next;
        });
      },
      onMove: (key, delta) => {
        const next = moveStepBy(latest.current, key, delta);
        if (next === latest.current) return;
        setPhases(() => next);
        setSaid(`Moved ${delta === -1 ? 'up' : 'down'}: now ${placeWords(next, key)}.`);
        focusAfter.current = `${key}:${delta === -1 ? 'up' : 'down'}`;
      },
      onToggle: (key) =>
        setOpen((prev) => {
          const next = new Set(prev);
          if (next.has(key)) next.delete(key);
          else next.add(key);
          return next;
        }),
      onRemove: (key) => {
        const at = findStep(latest.current, key);
        if (!at) return;
        const step = latest.current[at.phase]!.steps[at.index]!;
        setPhases((prev) => removeStep(prev, key));
        setRemoved({ step, phase: at.phase, index: at.index });
        setSaid(`Step removed: ${stepSummary(step)}. Undo is offered at the top of the steps.`);
      },
      onAddAfter: (key) => {
        const at = findStep(latest.current, key);
        if (!at) return;
        const before = latest.current[at.phase]!.steps[at.index]!;
        const step = blankStep(before.station);
        setPhases((prev) => insertStep(prev, at.phase, step, key));
        setFresh((prev) => new Set(prev).add(step.key));
        setOpen((prev) => new Set(prev).add(step.key));
        setSaid(`New step added below step ${numbers.get(key) ?? ''}.`);
      },
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [setPhases, numbers],
  );

  const addStepToPhase = (phase: number) => {
    const list = latest.current;
    const last = list[phase]?.steps.at(-1) ?? list.slice(0, phase).flatMap((p) => p.steps).at(-1);
    const step = blankStep(last?.station ?? stations[0]?.code ?? '');
    setPhases((prev) => insertStep(prev, phase, step));
    setFresh((prev) => new Set(prev).add(step.key));
    setOpen((prev) => new Set(prev).add(step.key));
    setSaid(`New step added at the end of ${list[phase]?.name || `phase ${phase + 1}`}.`);
  };

  const phaseActions: PhaseActions = {
    onRename: (index, name) => setPhases((prev) => prev.map((p, i) => (i === index ? { ...p, name } : p))),
    onMove: (from, to) => {
      setPhases((prev) => movePhase(prev, from, to));
      if (to >= 0 && to < latest.current.length) setSaid(`Phase moved: now phase ${to + 1} of ${latest.current.length}.`);
    },
    onRemove: (index) => {
      setSaid(`Phase ${index + 1} removed with its steps.`);
      setPhases((prev) => prev.filter((_, i) => i !== index));
    },
    onAdd: () => {
      setPhases((prev) => [...prev, blankPhase('')]);
      setSaid('New phase added at the end. Name it.');
    },
  };

  // ------------------------------------------------------------ drag and drop of steps

  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 4 } }),
    // A short press on the handle starts a drag; a swipe elsewhere still scrolls the page.
    useSensor(TouchSensor, { activationConstraint: { delay: 150, tolerance: 8 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );

  // Over a step, that step; over an empty phase, the phase; otherwise the nearest step.
  const collisions: CollisionDetection = useCallback((args) => {
    const within = pointerWithin(args);
    const steps = within.filter((c) => !String(c.id).startsWith(PHASE_DROP));
    if (steps.length) return steps;
    if (within.length) return within;
    return closestCenter(args);
  }, []);

  const targetOf = (list: readonly PhaseDraft[], overId: string): number | null => {
    if (overId.startsWith(PHASE_DROP)) {
      const i = list.findIndex((p) => p.key === overId.slice(PHASE_DROP.length));
      return i >= 0 ? i : null;
    }
    return findStep(list, overId)?.phase ?? null;
  };

  const onDragStart = ({ active }: DragStartEvent) => {
    beforeDrag.current = latest.current;
    setActiveKey(String(active.id));
  };

  // Crossing into another phase moves the step there at once, so the list opens a gap where it will land.
  const onDragOver = ({ active, over }: DragOverEvent) => {
    if (!over) return;
    const key = String(active.id);
    const overId = String(over.id);
    const list = latest.current;
    const from = findStep(list, key);
    const toPhase = targetOf(list, overId);
    if (!from || toPhase === null || toPhase === from.phase) return;
    let index = list[toPhase]!.steps.length;
    if (!overId.startsWith(PHASE_DROP)) {
      const overAt = findStep(list, overId)!;
      const rect = active.rect.current.translated;
      const below = rect ? rect.top + rect.height / 2 > over.rect.top + over.rect.height / 2 : false;
      index = overAt.index + (below ? 1 : 0);
    }
    setPhases((prev) => moveStepTo(prev, key, { phase: toPhase, index }));
  };

  const onDragEnd = ({ active, over }: DragEndEvent) => {
    setActiveKey(null);
    const key = String(active.id);
    const start = beforeDrag.current;
    beforeDrag.current = null;
    if (!over) {
      if (start) setPhases(() => start);
      return;
    }
    const overId = String(over.id);
    const list = latest.current;
    const from = findStep(list, key);
    if (from && !overId.startsWith(PHASE_DROP) && overId !== key) {
      const to = findStep(list, overId);
      if (to && to.phase === from.phase) setPhases((prev) => moveStepTo(prev, key, { phase: to.phase, index: to.index }));
    }
  };

  const onDragCancel = () => {
    setActiveKey(null);
    if (beforeDrag.current) {
      const start = beforeDrag.current;
      setPhases(() => start);
    }
    beforeDrag.current = null;
  };

  // Our own words for screen readers, read from the latest draft.
  const announcements: Announcements = {
    onDragStart: ({ active }) =>
      `Picked up step ${numbers.get(String(active.id)) ?? ''}: ${stepSummaryOf(latest.current, String(active.id))}. Up and down arrows move it, across phases too. Space drops it, Escape puts it back.`,
    onDragOver: ({ active, over }) => (over ? `It would now be ${placeWords(latest.current, String(active.id))}.` : 'Not over a place in the list.'),
    onDragEnd: ({ active }) => `Dropped. It is now ${placeWords(latest.current, String(active.id))}.`,
    onDragCancel: ({ active }) => `Move cancelled. The step is back as ${placeWords(beforeDrag.current ?? latest.current, String(active.id))}.`,
  };

  const activeStep = activeKey ? phases.flatMap((p) => p.steps).find((s) => s.key === activeKey) : undefined;

  // ------------------------------------------------------------ save

  const onSave = async () => {
    setShowAll(true);
    setSaved(null);
    if (check.list.length > 0 || checkDraft(phases, refs).list.length > 0) {
      requestAnimationFrame(() => summaryRef.current?.focus());
      return;
    }
    const { phases: content } = draftToContent(phases);
    try {
      const result = await save.mutateAsync({ procedureId: revision.procedureId, rev: revision.number, content: { phases: content } });
      const next = phasesToDraft(result.phases);
      setPhasesRaw(next);
      setBaseline(next);
      setCautions(cautionMap(result));
      setFresh(new Set());
      setShowAll(false);
      setRemoved(null);
      setServer(null);
      setSaved({ cleared: result.signoffsCleared });
    } catch (error) {
      setServer({
        problems: isApiError(error) ? serverProblems(error.details) : new Map(),
        message: errorMessage(error),
      });
      requestAnimationFrame(() => summaryRef.current?.focus());
    }
  };

  const openStepAt = (path: string) => {
    const m = /^phases\.(\d+)\.steps\.(\d+)/.exec(path);
    const key = m ? phases[Number(m[1])]?.steps[Number(m[2])]?.key : undefined;
    if (!key) return;
    setOpen((prev) => new Set(prev).add(key));
    requestAnimationFrame(() => {
      const card = document.querySelector<HTMLElement>(`[data-step-key="${key}"]`);
      card?.scrollIntoView({ block: 'start' });
      (card?.querySelector<HTMLElement>('[aria-invalid="true"]') ?? card?.querySelector<HTMLElement>('input, select, textarea'))?.focus();
    });
  };

  const summaryList = showAll || server ? [...visible].map(([path, message]) => ({ path, message })) : [];
  const phaseNameProblems = new Map<number, string>();
  for (const [path, message] of visible) {
    const m = /^phases\.(\d+)\.name$/.exec(path);
    if (m) phaseNameProblems.set(Number(m[1]), message);
  }
  const total = stepTotal(phases);
  const problemCount = visible.size;

  return (
    <div className="flex flex-col gap-6">
      <LeaveGuard when={dirty} />
      <p aria-live="polite" className="sr-only">
        {said}
      </p>
      <Notice tone="info" title="How to edit">
        <ul className="list-disc space-y-1 pl-5">
          <li>Drag a step or a phase by its handle (the dotted square), or use its Up and Down buttons. Steps move across phases too.</li>
          <li>With a keyboard: Tab to a handle, press Space, move with the arrow keys, press Space to drop or Escape to cancel.</li>
          <li>Nothing is kept until you press Save draft. Saving a change clears any sign-off already given.</li>
        </ul>
      </Notice>

      <div ref={summaryRef} tabIndex={-1}>
        {server ? (
          <Notice tone="danger" title="Not saved">
            <p>{server.message}</p>
          </Notice>
        ) : null}
        {summaryList.length ? (
          <Notice tone="danger" title={`${summaryList.length} problem${summaryList.length === 1 ? '' : 's'} to fix before saving`} className={server ? 'mt-3' : ''}>
            <ol className="mt-1 list-decimal space-y-1 pl-6">
              {summaryList.slice(0, 30).map((p) => (
                <li key={p.path}>
                  {/^phases\.\d+\.steps\.\d+/.test(p.path) ? (
                    <button type="button" className="cursor-pointer text-left font-bold text-link underline decoration-2 underline-offset-4" onClick={() => openStepAt(p.path)}>
                      {problemPlace(phases, p.path, numbers)}
                    </button>
                  ) : (
                    <span className="font-bold">{pathText(p.path, (i) => phases[i]?.name)}</span>
                  )}
                  : {p.message}
                </li>
              ))}
            </ol>
            {summaryList.length > 30 ? <p className="mt-1">…and {summaryList.length - 30} more.</p> : null}
          </Notice>
        ) : null}
        {saved ? (
          <Notice tone="success" title="Draft saved">
            <p>
              {saved.cleared
                ? 'The content changed, so the sign-offs already given were cleared: the revision needs both signatures again.'
                : 'Your changes are kept.'}{' '}
              <Link to={`/procedures/${revision.procedureId}/revisions/${revision.number}`}>See the revision with its cautions</Link>.
            </p>
          </Notice>
        ) : null}
      </div>

      <Section title="Phases">
        <PhaseOrder phases={phases} nameProblems={phaseNameProblems} actions={phaseActions} />
      </Section>

      <section aria-labelledby="steps-heading" className="flex min-w-0 flex-col gap-4">
        <h2 id="steps-heading" className="text-2xl font-bold">
          Steps ({total})
        </h2>
        {removed ? (
          <Notice tone="info" title="Step removed">
            <p className="break-words">{stepSummary(removed.step)}</p>
            <Button
              className="mt-2"
              onClick={() => {
                const r = removed;
                setPhases((prev) => {
                  if (r.phase >= prev.length) return prev;
                  const next = prev.map((p) => ({ ...p, steps: [...p.steps] }));
                  next[r.phase]!.steps.splice(Math.min(r.index, next[r.phase]!.steps.length), 0, r.step);
                  return next;
                });
                setRemoved(null);
                setSaid('Step put back.');
              }}
            >
              Undo remove
            </Button>
          </Notice>
        ) : null}
        {phases.length === 0 ? <p>No phases yet. Add a phase above, then add its steps.</p> : null}
        <DndContext
          sensors={sensors}
          collisionDetection={collisions}
          onDragStart={onDragStart}
          onDragOver={onDragOver}
          onDragEnd={onDragEnd}
          onDragCancel={onDragCancel}
          accessibility={{
            announcements,
            screenReaderInstructions: {
              draggable:
                'To move a step, press Space on its handle. The up and down arrow keys move it, across phases too. Press Space again to drop it, or Escape to cancel. The Up and Down buttons beside it do the same one place at a time.',
            },
          }}
        >
          {phases.map((phase, p) => (
            <PhaseSteps key={phase.key} phase={phase} index={p} onAdd={() => addStepToPhase(p)}>
              {phase.steps.map((step, i) => (
                <EditorStep
                  key={step.key}
                  step={step}
                  number={numbers.get(step.key) ?? 0}
                  phaseName={phase.name}
                  open={open.has(step.key)}
                  canUp={canMoveStep(phases, step.key, -1)}
                  canDown={canMoveStep(phases, step.key, 1)}
                  problems={visibleAt(visible, p, i)}
                  savedCautions={cautions.get(step.key) ?? null}
                  stations={stations}
                  hazards={hazards}
                  actions={stepActions}
                />
              ))}
            </PhaseSteps>
          ))}
          <DragOverlay>{activeStep ? <StepDragPreview step={activeStep} number={numbers.get(activeStep.key) ?? 0} /> : null}</DragOverlay>
        </DndContext>
      </section>

      <p className="max-w-prose text-sm text-ink-muted">{RELEASE_CAUTION}</p>

      <div className="hf-no-print sticky bottom-0 z-20 -mx-4 border-t-4 border-line bg-surface px-4 py-3">
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <Button variant="primary" onClick={() => void onSave()} pending={save.isPending} pendingLabel="Saving…" disabled={!dirty && !server}>
            Save draft
          </Button>
          <p role="status" className="font-bold">
            {dirty ? 'Unsaved changes' : 'No unsaved changes'}
            {problemCount ? ` · ${problemCount} problem${problemCount === 1 ? '' : 's'}` : ''}
          </p>
          <Link to={`/procedures/${revision.procedureId}/revisions/${revision.number}`}>Back to the revision</Link>
        </div>
      </div>
    </div>
  );
}

function cautionMap(revision: RevisionDto): Map<string, ResolvedCaution[]> {
  return new Map(revision.phases.flatMap((p) => p.steps.map((s) => [s.key, s.cautions] as const)));
}

function stepSummaryOf(list: readonly PhaseDraft[], key: string): string {
  const at = findStep(list, key);
  return at ? stepSummary(list[at.phase]!.steps[at.index]!, 60) : '';
}

function visibleAt(visible: ReadonlyMap<string, string>, phase: number, index: number): Map<string, string> {
  return stepProblemsAt(visible, phase, index);
}

function problemPlace(phases: readonly PhaseDraft[], path: string, numbers: ReadonlyMap<string, number>): string {
  const m = /^phases\.(\d+)\.steps\.(\d+)\.?(.*)$/.exec(path);
  if (!m) return pathText(path);
  const step = phases[Number(m[1])]?.steps[Number(m[2])];
  const field = m[3] ? pathText(m[3]).toLowerCase() : '';
  return `Step ${step ? numbers.get(step.key) : Number(m[2]) + 1}${field ? `, ${field}` : ''}`;
}

/** One phase's steps: a drop area of its own, so an empty phase can take a step too. */
function PhaseSteps({ phase, index, onAdd, children }: { phase: PhaseDraft; index: number; onAdd: () => void; children: ReactNode }) {
  const { setNodeRef, isOver } = useDroppable({ id: `${PHASE_DROP}${phase.key}`, disabled: phase.steps.length > 0 });
  const name = phase.name.trim() || `Phase ${index + 1} (unnamed)`;
  return (
    <section aria-labelledby={`edit-phase-${phase.key}`} className="min-w-0">
      <h3 id={`edit-phase-${phase.key}`} className="mb-2 border-b-2 border-line pb-1 text-xl font-bold">
        {index + 1}. {name}
      </h3>
      <SortableContext id={phase.key} items={phase.steps.map((s) => s.key)} strategy={verticalListSortingStrategy}>
        <ol
          ref={setNodeRef}
          aria-label={`Steps of ${name}`}
          className={`flex min-h-16 flex-col gap-3 rounded-md ${phase.steps.length === 0 ? `border-2 border-dashed p-3 ${isOver ? 'border-line bg-selected' : 'border-line-soft'}` : ''}`}
        >
          {phase.steps.length === 0 ? <li className="text-ink-muted">No steps yet. Drop a step here, or add one.</li> : null}
          {children}
        </ol>
      </SortableContext>
      <Button className="mt-3" onClick={onAdd}>
        Add a step to {name}
      </Button>
    </section>
  );
}
