import {
  DndContext,
  KeyboardSensor,
  MouseSensor,
  TouchSensor,
  closestCenter,
  useSensor,
  useSensors,
  type Announcements,
  type DragEndEvent,
} from '@dnd-kit/core';
import { SortableContext, sortableKeyboardCoordinates, useSortable, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import { useRef, useState } from 'react';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import type { PhaseDraft } from '../lib/draft';
import { DragHandle } from './DragHandle';

export interface PhaseActions {
  onRename: (index: number, name: string) => void;
  onMove: (from: number, to: number) => void;
  onRemove: (index: number) => void;
  onAdd: () => void;
}

const phaseName = (p: PhaseDraft | undefined, i: number) => (p?.name.trim() ? p.name.trim() : `phase ${i + 1}`);

/**
 * The phases in order, compact, so a whole phase moves without dragging its steps across the screen.
 * Drag by the handle, or use Up and Down.
 */
export function PhaseOrder({ phases, nameProblems, actions }: { phases: readonly PhaseDraft[]; nameProblems: ReadonlyMap<number, string>; actions: PhaseActions }) {
  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 4 } }),
    useSensor(TouchSensor, { activationConstraint: { delay: 150, tolerance: 8 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );
  const latest = useRef(phases);
  latest.current = phases;
  const indexOf = (id: string | number) => latest.current.findIndex((p) => p.key === id);

  const announcements: Announcements = {
    onDragStart: ({ active }) => `Picked up ${phaseName(latest.current[indexOf(active.id)], indexOf(active.id))}, phase ${indexOf(active.id) + 1} of ${latest.current.length}. Arrow keys move it, Space drops it, Escape puts it back.`,
    onDragOver: ({ over }) => (over ? `It would become phase ${indexOf(over.id) + 1} of ${latest.current.length}.` : 'It is not over a place in the list.'),
    onDragEnd: ({ over }) => (over ? `Dropped. It is now phase ${indexOf(over.id) + 1} of ${latest.current.length}.` : 'Dropped where it was.'),
    onDragCancel: ({ active }) => `Move cancelled. ${phaseName(latest.current[indexOf(active.id)], indexOf(active.id))} stays phase ${indexOf(active.id) + 1}.`,
  };

  const onDragEnd = ({ active, over }: DragEndEvent) => {
    if (!over || active.id === over.id) return;
    actions.onMove(indexOf(active.id), indexOf(over.id));
  };

  return (
    <div className="flex flex-col gap-3">
      <DndContext
        sensors={sensors}
        collisionDetection={closestCenter}
        onDragEnd={onDragEnd}
        accessibility={{
          announcements,
          screenReaderInstructions: {
            draggable: 'To move a phase, press Space on its handle, then the up and down arrow keys. Press Space again to drop it, or Escape to cancel.',
          },
        }}
      >
        <SortableContext items={phases.map((p) => p.key)} strategy={verticalListSortingStrategy}>
          <ol className="flex flex-col gap-2" aria-label="Phases in order">
            {phases.map((p, i) => (
              <PhaseRow key={p.key} phase={p} index={i} count={phases.length} error={nameProblems.get(i)} actions={actions} />
            ))}
          </ol>
        </SortableContext>
      </DndContext>
      <div>
        <Button onClick={actions.onAdd}>Add a phase</Button>
      </div>
    </div>
  );
}

function PhaseRow({ phase, index, count, error, actions }: { phase: PhaseDraft; index: number; count: number; error?: string; actions: PhaseActions }) {
  const sortable = useSortable({ id: phase.key, attributes: { roleDescription: 'movable phase' } });
  const [confirming, setConfirming] = useState(false);
  const style = { transform: CSS.Translate.toString(sortable.transform), transition: sortable.transition };
  const n = phase.steps.length;
  return (
    <li
      ref={sortable.setNodeRef}
      style={style}
      className={`rounded-md border-2 bg-surface p-2 ${sortable.isDragging ? 'relative z-10 border-line shadow-lg' : 'border-line-soft'}`}
    >
      <div className="grid grid-cols-[auto_minmax(0,1fr)] items-start gap-2 lg:grid-cols-[auto_minmax(0,1fr)_auto] lg:items-end">
        <DragHandle
          label={`Move phase ${index + 1}: ${phase.name || 'unnamed'}`}
          attributes={sortable.attributes}
          listeners={sortable.listeners}
          handleRef={sortable.setActivatorNodeRef}
        />
        <TextField
          label={`Phase ${index + 1} name (${n} step${n === 1 ? '' : 's'})`}
          value={phase.name}
          onChange={(e) => actions.onRename(index, e.target.value)}
          error={error}
          className="min-w-0"
        />
        <div className="col-span-2 flex flex-wrap gap-2 lg:col-span-1">
          <Button onClick={() => actions.onMove(index, index - 1)} disabled={index === 0} aria-label={`Move phase ${index + 1} up`}>
            <span aria-hidden="true">▲</span> Up
          </Button>
          <Button onClick={() => actions.onMove(index, index + 1)} disabled={index === count - 1} aria-label={`Move phase ${index + 1} down`}>
            <span aria-hidden="true">▼</span> Down
          </Button>
          {confirming ? (
            <>
              <Button variant="danger" onClick={() => actions.onRemove(index)}>
                Remove it and its {n} step{n === 1 ? '' : 's'}
              </Button>
              <Button variant="quiet" onClick={() => setConfirming(false)}>
                Keep it
              </Button>
            </>
          ) : (
            <Button variant="quiet" onClick={() => (n ? setConfirming(true) : actions.onRemove(index))} aria-label={`Remove phase ${index + 1}`}>
              Remove
            </Button>
          )}
        </div>
      </div>
    </li>
  );
}
