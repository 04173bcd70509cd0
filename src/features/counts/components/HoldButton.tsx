import { useEffect, useId, useRef, useState } from 'react';
import { Glyph } from '../../../components/ui/Glyph';

export const HOLD_PRESS_MS = 1500;

/**
 * HOLD needs a deliberate press: keep a finger, the mouse button, Space or Enter down for 1.5 s while the bar
 * fills. Letting go early cancels, so a stray tap in a pocket never stops a count.
 */
export function HoldButton({ onHeld, disabled = false }: { onHeld: () => void; disabled?: boolean }) {
  const hintId = useId();
  const [progress, setProgress] = useState(0);
  const started = useRef<number | null>(null);
  const done = useRef<ReturnType<typeof setTimeout> | null>(null);
  const tick = useRef<ReturnType<typeof setInterval> | null>(null);

  const stop = () => {
    if (done.current) clearTimeout(done.current);
    if (tick.current) clearInterval(tick.current);
    done.current = null;
    tick.current = null;
    started.current = null;
    setProgress(0);
  };

  const start = () => {
    if (disabled || started.current !== null) return;
    started.current = Date.now();
    setProgress(0.01);
    tick.current = setInterval(() => {
      if (started.current !== null) setProgress(Math.min(1, (Date.now() - started.current) / HOLD_PRESS_MS));
    }, 50);
    done.current = setTimeout(() => {
      stop();
      onHeld();
    }, HOLD_PRESS_MS);
  };

  useEffect(() => stop, []);

  const pressing = progress > 0;
  return (
    <div className="flex flex-col gap-1">
      <button
        type="button"
        disabled={disabled}
        aria-describedby={hintId}
        className="relative min-h-20 w-full touch-none select-none overflow-hidden rounded-md border-[3px] border-danger bg-danger-wash px-4 text-3xl font-bold tracking-wide text-danger disabled:opacity-70"
        onPointerDown={(e) => {
          e.currentTarget.setPointerCapture?.(e.pointerId);
          start();
        }}
        onPointerUp={stop}
        onPointerCancel={stop}
        onPointerLeave={stop}
        onContextMenu={(e) => e.preventDefault()}
        onKeyDown={(e) => {
          if ((e.key === ' ' || e.key === 'Enter') && !e.repeat) {
            e.preventDefault();
            start();
          }
        }}
        onKeyUp={(e) => {
          if (e.key === ' ' || e.key === 'Enter') stop();
        }}
        onBlur={stop}
        onClick={(e) => e.preventDefault()}
      >
        <span aria-hidden="true" className="absolute inset-y-0 left-0 bg-danger/30" style={{ width: `${Math.round(progress * 100)}%` }} />
        <span className="relative inline-flex items-center gap-2">
          <Glyph shape="diamond" className="size-8" /> HOLD
        </span>
      </button>
      <p id={hintId} className="text-center text-sm font-bold" aria-live="polite">
        {pressing ? `Keep holding… ${Math.round(progress * 100)}%` : 'Press and hold 1.5 s (or hold Space) to call a hold'}
      </p>
    </div>
  );
}
