import type { DraggableAttributes, DraggableSyntheticListeners } from '@dnd-kit/core';
import type { Ref } from 'react';

/**
 * The grip a step or phase is dragged by: 48 px square so a gloved finger finds it, `touch-none` so a
 * drag on it does not scroll the page (the rest of the card still scrolls), and a real button so a keyboard
 * reaches it (Space picks up, arrows move, Space drops, Escape cancels).
 */
export function DragHandle({
  label,
  attributes,
  listeners,
  handleRef,
  disabled = false,
}: {
  label: string;
  attributes: DraggableAttributes;
  listeners: DraggableSyntheticListeners;
  handleRef?: Ref<HTMLButtonElement>;
  disabled?: boolean;
}) {
  return (
    <button
      type="button"
      ref={handleRef}
      {...attributes}
      {...listeners}
      aria-label={label}
      disabled={disabled}
      data-drag-handle=""
      className="flex size-12 shrink-0 cursor-grab touch-none items-center justify-center rounded-md border-2 border-line bg-sunken text-ink hover:bg-selected active:cursor-grabbing disabled:cursor-not-allowed disabled:opacity-60"
    >
      <svg viewBox="0 0 16 24" aria-hidden="true" focusable="false" className="h-7 w-5">
        {[5, 11].map((x) => [5, 12, 19].map((y) => <circle key={`${x}-${y}`} cx={x} cy={y} r="2.2" fill="currentColor" />))}
      </svg>
    </button>
  );
}
